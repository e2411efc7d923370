/**
 * Internal alerts to the receiving company's buyers and quality managers, sent through the same
 * outbox as supplier notices (organisation = own company, kind 'alert'), so they are written in
 * the transaction of the event that raised them and are never lost or sent twice.
 */
import { and, eq, inArray } from 'drizzle-orm';
import escapeHtml from 'escape-html';
import type { Tx } from '../db';
import { lots, notices, organisations, parts, users } from '../db/schema';
import type { SeverityView } from './switching';
import { recordAudit } from './audit';
import { enqueueNoticeSend } from '../mail/outbox';
import { appOrigin } from '../origin';

async function staffRecipients(tx: Tx, roles: ('buyer' | 'quality')[] = ['buyer', 'quality']): Promise<string[]> {
	const rows = await tx
		.select({ email: users.email })
		.from(users)
		.where(and(inArray(users.role, roles), eq(users.active, true)));
	return [...new Set(rows.map((r) => r.email.toLowerCase()))];
}

/** ISO 2859-1 9.4: inspection of a supplier × part is discontinued; buyer and quality must act. */
export async function alertInspectionDiscontinued(tx: Tx, lotId: string, view: SeverityView): Promise<string | null> {
	const [row] = await tx
		.select({ lotCode: lots.lotCode, partId: parts.id, partNumber: parts.partNumber, supplier: organisations.name })
		.from(lots)
		.innerJoin(parts, eq(parts.id, lots.partId))
		.innerJoin(organisations, eq(organisations.id, lots.supplierId))
		.where(eq(lots.id, lotId));
	const [own] = await tx.select({ id: organisations.id }).from(organisations).where(eq(organisations.kind, 'own')).limit(1);
	const recipients = await staffRecipients(tx);
	if (!row || !own || recipients.length === 0) return null;
	const subject = `Inspection discontinued: ${row.supplier} ${row.partNumber} (after lot ${row.lotCode})`;
	const partUrl = `${appOrigin()}/parts/${row.partId}`;
	const lines = [
		`Sampling inspection of ${row.partNumber} from ${row.supplier} is discontinued.`,
		'',
		`Five lots were not accepted while inspection was tightened (ISO 2859-1, clause 9.4); the last was lot ${row.lotCode}.`,
		'',
		'What happens now:',
		'- New lots of this part from this supplier are held on arrival until inspection is resumed.',
		'- Buyer: ask the supplier for a corrective action and agree what happens to open orders.',
		'- Quality: review the corrective action; when it is accepted, resume inspection on the part page (it restarts on tightened inspection).',
		'',
		`Switching history and the resume form: ${partUrl}`,
		'',
		`The last decided lots: ${view.lots
			.slice(-8)
			.map((l) => `${l.lot_code} ${l.accepted ? 'accepted' : 'not accepted'}`)
			.join(', ')}.`
	];
	const text = lines.join('\n');
	const html = `<p>${lines.map(escapeHtml).join('<br>')}</p>`.replace(
		escapeHtml(partUrl),
		`<a href="${escapeHtml(partUrl)}">${escapeHtml(partUrl)}</a>`
	);
	const [notice] = await tx
		.insert(notices)
		.values({ lotId, organisationId: own.id, kind: 'alert', recipients, subject, bodyText: text, bodyHtml: html })
		.returning({ id: notices.id });
	await enqueueNoticeSend(tx, notice.id);
	await recordAudit(tx, {
		action: 'inspection.discontinued',
		entityType: 'part',
		entityId: row.partId,
		lotId,
		details: { notice_id: notice.id, recipients, severity: view.severity }
	});
	return notice.id;
}

/**
 * A lot went on hold for material review (the engine proposed hold or reject, or the part is
 * released only by quality): quality managers are told by e-mail; the supplier hears nothing yet.
 */
export async function alertLotInReview(
	tx: Tx,
	lotId: string,
	proposal: string,
	safety: boolean,
	findings: string[]
): Promise<string | null> {
	const [row] = await tx
		.select({ lotCode: lots.lotCode, poNumber: lots.poNumber, partNumber: parts.partNumber, supplier: organisations.name })
		.from(lots)
		.innerJoin(parts, eq(parts.id, lots.partId))
		.innerJoin(organisations, eq(organisations.id, lots.supplierId))
		.where(eq(lots.id, lotId));
	const [own] = await tx.select({ id: organisations.id }).from(organisations).where(eq(organisations.kind, 'own')).limit(1);
	const recipients = await staffRecipients(tx, ['quality']);
	if (!row || !own || recipients.length === 0) return null;
	const subject = `Lot ${row.lotCode} on hold for your review (engine proposes ${proposal}; ${row.supplier} ${row.partNumber})`;
	const reviewUrl = `${appOrigin()}/review/${lotId}`;
	const lines = [
		`Lot ${row.lotCode} (PO ${row.poNumber}, ${row.partNumber} from ${row.supplier}) is on hold in quarantine.`,
		`The engine proposes: ${proposal}. Nothing has been sent to the supplier; they are told after you record the disposition.`,
		...(safety ? ['', 'Safety finding: keep the units apart in quarantine and follow the site procedure and local codes.'] : []),
		...(findings.length ? ['', 'Findings:', ...findings.map((f) => `- ${f}`)] : []),
		'',
		`Review and sign the disposition: ${reviewUrl}`
	];
	const text = lines.join('\n');
	const html = `<p>${lines.map(escapeHtml).join('<br>')}</p>`.replace(
		escapeHtml(reviewUrl),
		`<a href="${escapeHtml(reviewUrl)}">${escapeHtml(reviewUrl)}</a>`
	);
	const [notice] = await tx
		.insert(notices)
		.values({ lotId, organisationId: own.id, kind: 'alert', recipients, subject, bodyText: text, bodyHtml: html })
		.returning({ id: notices.id });
	await enqueueNoticeSend(tx, notice.id);
	await recordAudit(tx, {
		action: 'lot.review_alerted',
		entityType: 'lot',
		entityId: lotId,
		lotId,
		details: { notice_id: notice.id, recipients, proposal }
	});
	return notice.id;
}
