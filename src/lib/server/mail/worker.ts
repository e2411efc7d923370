/**
 * The outbox worker: a graphile-worker runner in every app process with the one task
 * 'send_notice' (see outbox.ts for the states and the at-least-once boundary). The task renders the
 * PDF inspection report, sends the notice over SMTP and records the attempt on the notice row; a
 * thrown error makes graphile-worker retry the job later. The runner's schema is installed by
 * `npm run migrate` as the owner role (scripts/lib/migrate.mjs); at start it only checks that the
 * schema is current, which the app role may do. It stops on adapter-node's 'sveltekit:shutdown',
 * after the jobs in flight have finished.
 */
import { Logger, run, type Runner, type Task } from 'graphile-worker';
import { eq } from 'drizzle-orm';
import { databaseUrl, getDb } from '../db';
import { notices } from '../db/schema';
import { renderInspectionReport } from '../reports';
import { buildReportData } from '../services/report-data';
import { createTransport, mailFrom } from './transport';
import { deliverWebhookTask } from '../webhooks/task';
import { DELIVER_WEBHOOK_TASK } from '../services/webhooks';
import {
	markAttemptFailed,
	markSent,
	noticeMessageId,
	outboxOptionsFromEnv,
	SEND_NOTICE_TASK,
	type OutboxNotice,
	type OutboxOptions
} from './outbox';

async function reportAttachment(notice: OutboxNotice) {
	// The report as of the notice's own decision, even when the mail goes out after a later one.
	const data = await buildReportData(getDb(), notice.lotId, { decisionId: notice.decisionId });
	const pdf = await renderInspectionReport(data);
	return { filename: `inspection-report-${data.lot.lot_code}.pdf`, content: Buffer.from(pdf), contentType: 'application/pdf' };
}

async function sendNotice(notice: OutboxNotice): Promise<{ messageId: string; response: string }> {
	const transport = createTransport();
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
		return { messageId: info.messageId ?? messageId, response: String(info.response ?? '') };
	} finally {
		transport.close();
	}
}

const sendNoticeTask: Task = async (payload, helpers) => {
	const { noticeId } = payload as { noticeId: string };
	const [notice] = await getDb().select().from(notices).where(eq(notices.id, noticeId));
	// Sent already (a job run again after its lock expired) or deleted with its lot: nothing to do.
	if (!notice || notice.status !== 'pending') return;
	const { attempts, max_attempts } = helpers.job; // attempts counts this one
	let sent: { messageId: string; response: string };
	try {
		sent = await sendNotice(notice);
	} catch (error) {
		const message = (error instanceof Error ? error.message : String(error)).slice(0, 500);
		await markAttemptFailed(getDb(), notice, attempts, attempts >= max_attempts, message);
		throw error;
	}
	await markSent(getDb(), notice, attempts, sent.messageId, sent.response);
};

// graphile-worker's own info lines (connected, job completed) would fill the app's log, and its
// failure lines carry the whole stack: one line per failed attempt is enough.
const logger = new Logger(() => (level, message) => {
	if (level === 'error' || level === 'warning') console.warn(`[outbox] ${message.split('\n')[0]}`);
});

export function startOutboxWorker(o: OutboxOptions = outboxOptionsFromEnv()): () => Promise<void> {
	let stopped = false;
	let runner: Runner | undefined;
	let retry: ReturnType<typeof setTimeout> | undefined;

	// The database may be down when the process starts: try again until it is up.
	const start = async () => {
		try {
			const started = await run({
				connectionString: databaseUrl(),
				maxPoolSize: o.concurrency + 2,
				concurrency: o.concurrency,
				pollInterval: o.pollMs,
				noHandleSignals: true,
				logger,
				// Webhook deliveries share the queue: the same transactional add, retries and shutdown.
				taskList: { [SEND_NOTICE_TASK]: sendNoticeTask, [DELIVER_WEBHOOK_TASK]: deliverWebhookTask }
			});
			if (stopped) await started.stop();
			else runner = started;
		} catch (error) {
			console.error('[outbox] the worker could not start, trying again shortly:', error instanceof Error ? error.message : error);
			if (!stopped) retry = setTimeout(start, Math.max(o.pollMs, 5000));
		}
	};
	const stop = async () => {
		stopped = true;
		clearTimeout(retry);
		await runner?.stop();
	};
	void start();
	process.once('sveltekit:shutdown', () => void stop());
	return stop;
}
