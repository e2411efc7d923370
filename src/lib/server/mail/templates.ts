/**
 * Supplier notice bodies (plain text and HTML) for accept, hold, reject and quality overrides.
 * Rendered when the decision is written, so the outbox row holds exactly what will be sent.
 */
import escapeHtml from 'escape-html';
import { quantity } from '$lib/format';
import { LOT_STATUS } from '$lib/status';
import { THEME_HEX } from '../reports/palette';
import { DISPOSITION, type MaterialDisposition } from '$lib/schemas/disposition';

export type NoticeKind = 'accept' | 'hold' | 'reject' | 'override';
export type FinalStatus = 'accepted' | 'on_hold' | 'rejected';

/** A unit the decision counts as nonconforming: its serial, the voltage read and why. */
export interface NonconformingUnit {
	serial: string;
	ocvV: number | null;
	reason: string;
}

export interface NoticeInput {
	kind: NoticeKind;
	status: FinalStatus;
	companyName: string;
	supplierName: string;
	lotCode: string;
	poNumber: string;
	partNumber: string;
	partDescription: string;
	quantity: number;
	transport: string;
	lithium: boolean;
	safety: boolean;
	reasons: string[];
	/** The quality manager's reason, for overrides. */
	decisionReason: string | null;
	/** The quality manager's material disposition (null for an automatic release). */
	disposition: MaterialDisposition | null;
	/** The date (YYYY-MM-DD) by which the supplier is asked to act; null when nothing is asked. */
	dueDate: string | null;
	nonconforming: NonconformingUnit[];
	/** The sampling rule and its source, in words. */
	rule: string | null;
	portalUrl: string;
}

export interface NoticeBody {
	subject: string;
	text: string;
	html: string;
}

/** The lot's state in capitals, so it stands out in a subject line: the same words as on every page. */
const shout = (status: FinalStatus) => LOT_STATUS[status].word.toUpperCase();

function dispositionSentence(n: NoticeInput): string {
	if (n.disposition === 'use_as_is') return 'After review by our quality team the lot is used as is under a deviation.';
	if (n.disposition && n.disposition !== 'release')
		return `After review by our quality team the lot was rejected${n.safety ? ' for safety reasons' : ''}: ${DISPOSITION[n.disposition].label.toLowerCase()}.`;
	const after = n.kind === 'override' ? ' after review by our quality team' : '';
	if (n.status === 'accepted') return `The lot was accepted${after} and released for use.`;
	if (n.status === 'on_hold') return 'The lot is on hold in our quarantine area until our quality team has reviewed it.';
	return `The lot was rejected${after}${n.safety ? ' for safety reasons' : ''} and will not be used.`;
}

function actionsFor(n: NoticeInput): string[] {
	if (n.disposition) {
		const asks = DISPOSITION[n.disposition].asks;
		if (asks.length === 0) return ['No action is needed. Keep the attached inspection report with your shipment records.'];
		const due = n.dueDate ? ` by ${n.dueDate}` : '';
		return ['Acknowledge this notice in the supplier portal.', ...asks.map((a) => `${a.replace(/\.$/, '')}${due}.`)];
	}
	if (n.status === 'accepted') return ['No action is needed. Keep the attached inspection report with your shipment records.'];
	const common = [
		'Acknowledge this notice in the supplier portal.',
		'Reply in the portal with any information that explains the findings (production and charge records, certificate of conformity corrections).'
	];
	if (n.status === 'on_hold') return [...common, 'Do not ship further units of this part until you hear from us.'];
	return [
		...common,
		'Send a corrective-action report (for example an 8D) through the portal.',
		'Agree the return or disposal of the lot with our buyer; do not collect or ship units before that is arranged.'
	];
}

/** Calm cautions for quarantined and deep-discharged lithium units and for shipping them. */
export function noticeCautions(n: Pick<NoticeInput, 'status' | 'lithium' | 'safety' | 'transport'>): string[] {
	if (n.status === 'accepted' || !n.lithium) return [];
	// "Generally not accepted by air" for damaged/defective lithium cells: from memory (check the current
	// DG regulations); the marker stays here, not in the text the supplier reads.
	const cautions = [
		'Quarantined units stay in their packaging in a marked area, apart from combustible material. Swollen, damaged, leaking or hot units are separated at once.',
		'A lithium-ion cell that has rested below its minimum voltage must not be recharged: it may have internal damage and can heat up when charged.',
		'Returning cells is a dangerous-goods shipment. Damaged or defective lithium cells and batteries fall under special provisions and are generally not accepted by air. Lithium-ion cells and batteries shipped by air packed on their own must be at no more than 30 % SOC.'
	];
	cautions.push(
		'Follow your site procedure, local codes and the current dangerous-goods regulations before handling or shipping these units.'
	);
	return cautions;
}

function noticeSubject(n: NoticeInput): string {
	const prefix = n.kind === 'override' ? 'Quality decision' : 'Inspection result';
	const how = n.disposition && n.disposition !== 'release' ? ` (${DISPOSITION[n.disposition].label.toLowerCase()})` : '';
	return `${prefix}: lot ${n.lotCode} ${shout(n.status)}${how} (PO ${n.poNumber}, ${n.partNumber})`;
}

const volts = (v: number | null) => (v === null ? 'no reading' : `${v.toFixed(3)} V`);
const unitLine = (u: NonconformingUnit) => `${u.serial}: ${volts(u.ocvV)}, ${u.reason}`;

function textBody(n: NoticeInput): string {
	const lines = [
		`Dear ${n.supplierName} team,`,
		'',
		`${n.companyName} has inspected your lot on arrival.`,
		'',
		`Lot: ${n.lotCode}`,
		`Purchase order: ${n.poNumber}`,
		`Part: ${n.partNumber} (${n.partDescription})`,
		`Quantity: ${quantity(n.quantity)}`,
		`Disposition: ${shout(n.status)}${n.disposition ? ` (${DISPOSITION[n.disposition].label})` : ''}`,
		...(n.dueDate ? [`Reply due by: ${n.dueDate}`] : []),
		'',
		dispositionSentence(n)
	];
	if (n.decisionReason) lines.push('', `Reason given by our quality team: ${n.decisionReason}`);
	if (n.reasons.length) lines.push('', 'Findings:', ...n.reasons.map((r) => `- ${r}`));
	if (n.nonconforming.length)
		lines.push('', 'Nonconforming units (serial: voltage read, reason):', ...n.nonconforming.map((u) => `- ${unitLine(u)}`));
	if (n.rule) lines.push('', `Rule applied: ${n.rule}`);
	lines.push('', 'What we ask of you:', ...actionsFor(n).map((a) => `- ${a}`));
	const cautions = noticeCautions(n);
	if (cautions.length) lines.push('', 'Handling cautions:', ...cautions.map((c) => `- ${c}`));
	lines.push(
		'',
		`The inspection report is attached as a PDF. Supplier portal: ${n.portalUrl}`,
		'',
		`${n.companyName} receiving inspection (sent by Restvolt)`
	);
	return lines.join('\n');
}

function htmlBody(n: NoticeInput): string {
	const e = escapeHtml;
	const list = (items: string[]) => `<ul>${items.map((i) => `<li>${e(i)}</li>`).join('')}</ul>`;
	const row = (k: string, v: string) => `<tr><th align="left" style="padding:2px 12px 2px 0">${e(k)}</th><td>${e(v)}</td></tr>`;
	const cautions = noticeCautions(n);
	return [
		`<!doctype html><html><body style="font-family:system-ui,sans-serif;color:${THEME_HEX.ink}">`,
		`<p>Dear ${e(n.supplierName)} team,</p>`,
		`<p>${e(n.companyName)} has inspected your lot on arrival.</p>`,
		'<table>',
		row('Lot', n.lotCode),
		row('Purchase order', n.poNumber),
		row('Part', `${n.partNumber} (${n.partDescription})`),
		row('Quantity', quantity(n.quantity)),
		row('Disposition', `${shout(n.status)}${n.disposition ? ` (${DISPOSITION[n.disposition].label})` : ''}`),
		n.dueDate ? row('Reply due by', n.dueDate) : '',
		'</table>',
		`<p><strong>${e(dispositionSentence(n))}</strong></p>`,
		n.decisionReason ? `<p>Reason given by our quality team: ${e(n.decisionReason)}</p>` : '',
		n.reasons.length ? `<h3>Findings</h3>${list(n.reasons)}` : '',
		n.nonconforming.length ? `<h3>Nonconforming units (serial: voltage read, reason)</h3>${list(n.nonconforming.map(unitLine))}` : '',
		n.rule ? `<p>Rule applied: ${e(n.rule)}</p>` : '',
		`<h3>What we ask of you</h3>${list(actionsFor(n))}`,
		cautions.length ? `<h3>Handling cautions</h3>${list(cautions)}` : '',
		`<p>The inspection report is attached as a PDF. <a href="${e(n.portalUrl)}">Open the supplier portal</a>.</p>`,
		`<p>${e(n.companyName)} receiving inspection (sent by Restvolt)</p>`,
		'</body></html>'
	].join('\n');
}

export function renderNotice(n: NoticeInput): NoticeBody {
	return { subject: noticeSubject(n), text: textBody(n), html: htmlBody(n) };
}
