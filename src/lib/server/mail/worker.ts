/**
 * The outbox worker: every OUTBOX_POLL_MS it claims due notices (see outbox.ts for the states and
 * the at-least-once boundary), attaches the PDF inspection report and sends them over SMTP.
 * All state lives in this closure; background.ts starts it once per process, and it stops on
 * adapter-node's 'sveltekit:shutdown' after the batch in flight has finished.
 */
import { getDb } from '../db';
import { renderInspectionReport } from '../reports';
import { buildReportData } from '../services/report-data';
import { createTransport, mailFrom } from './transport';
import {
	claimDueNotices,
	markAttemptFailed,
	markSent,
	noticeMessageId,
	outboxOptionsFromEnv,
	type ClaimedNotice,
	type OutboxOptions
} from './outbox';

type Transport = ReturnType<typeof createTransport>;

async function reportAttachment(notice: ClaimedNotice) {
	// The report as of the notice's own decision, even when the mail goes out after a later one.
	const data = await buildReportData(getDb(), notice.lotId, { decisionId: notice.decisionId });
	const pdf = await renderInspectionReport(data);
	return { filename: `inspection-report-${data.lot.lot_code}.pdf`, content: Buffer.from(pdf), contentType: 'application/pdf' };
}

async function deliver(transport: Transport, notice: ClaimedNotice, o: OutboxOptions): Promise<void> {
	try {
		const messageId = noticeMessageId(notice.id);
		const info = await transport.sendMail({
			from: mailFrom(),
			to: notice.recipients,
			subject: notice.subject,
			text: notice.bodyText,
			html: notice.bodyHtml,
			messageId,
			headers: { 'X-Restvolt-Notice': notice.id },
			attachments: [await reportAttachment(notice)]
		});
		await markSent(getDb(), notice, info.messageId ?? messageId, String(info.response ?? ''));
	} catch (error) {
		const message = error instanceof Error ? error.message : String(error);
		const outcome = await markAttemptFailed(getDb(), notice, message.slice(0, 500), o);
		console.warn(`[outbox] notice ${notice.id} attempt ${notice.attempts} failed (${outcome}): ${message}`);
	}
}

/** One poll: claim a batch and send it, one notice after another. Returns how many were claimed. */
export async function runOutboxOnce(o: OutboxOptions = outboxOptionsFromEnv()): Promise<number> {
	const claimed = await claimDueNotices(getDb(), o);
	if (claimed.length === 0) return 0;
	const transport = createTransport();
	try {
		for (const notice of claimed) await deliver(transport, notice, o);
	} finally {
		transport.close();
	}
	return claimed.length;
}

export function startOutboxWorker(o: OutboxOptions = outboxOptionsFromEnv()): () => Promise<void> {
	let stopped = false;
	let timer: ReturnType<typeof setTimeout> | undefined;
	let inFlight: Promise<unknown> = Promise.resolve();

	const tick = async () => {
		inFlight = runOutboxOnce(o).catch((error) => console.error('[outbox] poll failed', error));
		await inFlight;
		if (!stopped) timer = setTimeout(tick, o.pollMs);
	};
	const stop = async () => {
		stopped = true;
		clearTimeout(timer);
		await inFlight;
	};
	timer = setTimeout(tick, Math.min(o.pollMs, 500));
	process.once('sveltekit:shutdown', () => void stop());
	return stop;
}
