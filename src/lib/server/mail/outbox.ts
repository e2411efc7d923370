/**
 * The mail outbox: a notices row holds what people see (pending, sent or failed; attempts; last
 * error), and a graphile-worker job ('send_notice', key notice:{id}) does the sending. Both are
 * written in the transaction of the decision that raised the notice, so neither exists without the
 * other. graphile-worker claims jobs with SKIP LOCKED, retries a failed attempt after exp(attempts)
 * seconds (capped at exp(10) ≈ 6 h), and gives a job held by a crashed process back after its lock
 * expires (4 hours); worker.ts records each attempt on the notice row.
 *
 *   pending ──SMTP accepted──► sent (message_id, sent_at)
 *   pending ──SMTP error──► pending, attempts+1, last_error   (or 'failed' after OUTBOX_MAX_ATTEMPTS)
 *   failed ──admin "retry now"──► pending, attempts 0, a new job
 *
 * Delivery is at-least-once: if the process dies after the SMTP server accepted a message and
 * before `markSent` commits, the job is run again after its lock expires and sees a pending
 * notice. Both copies carry the same Message-ID (<notice-{id}@restvolt.local>), so the duplicate is
 * detectable by the receiving side. Everywhere else a notice is sent exactly once.
 */
import { and, asc, desc, eq, inArray, sql } from 'drizzle-orm';
import type { Database, Tx } from '../db';
import { lots, notices } from '../db/schema';
import { recordAudit } from '../services/audit';

export const SEND_NOTICE_TASK = 'send_notice';

export interface OutboxOptions {
	pollMs: number;
	concurrency: number;
	/** Attempts before a notice is 'failed'. 12: exp(1) + … + exp(11) s ≈ 16 h of a relay being down. */
	maxAttempts: number;
}

export function outboxOptionsFromEnv(env: Record<string, string | undefined> = process.env): OutboxOptions {
	const num = (name: string, fallback: number) => {
		const value = Number(env[name]);
		return Number.isInteger(value) && value > 0 ? value : fallback;
	};
	return { pollMs: num('OUTBOX_POLL_MS', 2000), concurrency: 2, maxAttempts: Math.min(num('OUTBOX_MAX_ATTEMPTS', 12), 32767) };
}

export const noticeMessageId = (id: string) => `<notice-${id}@restvolt.local>`;
const noticeJobKey = (id: string) => `notice:${id}`;

/**
 * Add (or, for a failed notice, re-arm) the job that sends a notice, in the caller's transaction.
 * With a job key, graphile-worker replaces a waiting job of the same key instead of adding a second.
 */
export async function enqueueNoticeSend(tx: Database | Tx, noticeId: string): Promise<void> {
	await tx.execute(
		sql`select graphile_worker.add_job(${SEND_NOTICE_TASK}, json_build_object('noticeId', ${noticeId}::text), job_key => ${noticeJobKey(noticeId)}, max_attempts => ${outboxOptionsFromEnv().maxAttempts}::int)`
	);
}

export type OutboxNotice = typeof notices.$inferSelect;

export async function markSent(db: Database, notice: OutboxNotice, attempt: number, messageId: string, response: string): Promise<void> {
	await db.transaction(async (tx) => {
		await tx
			.update(notices)
			.set({ status: 'sent', attempts: attempt, messageId, sentAt: new Date(), lastError: null })
			.where(and(eq(notices.id, notice.id), eq(notices.status, 'pending')));
		await recordAudit(tx, {
			action: 'notice.sent',
			entityType: 'notice',
			entityId: notice.id,
			lotId: notice.lotId,
			details: { messageId, response, attempts: attempt, recipients: notice.recipients }
		});
	});
}

/** Record a failed attempt; after the job's last attempt the notice is 'failed' (graphile-worker keeps the job). */
export async function markAttemptFailed(
	db: Database,
	notice: OutboxNotice,
	attempt: number,
	lastAttempt: boolean,
	error: string
): Promise<void> {
	await db
		.update(notices)
		.set(lastAttempt ? { status: 'failed', attempts: attempt, lastError: error } : { attempts: attempt, lastError: error })
		.where(and(eq(notices.id, notice.id), eq(notices.status, 'pending')));
	if (lastAttempt) {
		await recordAudit(db, {
			action: 'notice.failed',
			entityType: 'notice',
			entityId: notice.id,
			lotId: notice.lotId,
			details: { attempts: attempt, error }
		});
	}
}

export interface OutboxRow {
	id: string;
	lotId: string;
	lotCode: string;
	kind: string;
	subject: string;
	recipients: string[];
	status: 'pending' | 'sent' | 'failed';
	attempts: number;
	nextAttemptAt: string | null;
	lastError: string | null;
	createdAt: string;
	sentAt: string | null;
}

/** For the admin page: everything not yet sent, then the latest sent ones. */
export async function listOutbox(db: Database, sentLimit = 20): Promise<{ open: OutboxRow[]; sent: OutboxRow[] }> {
	// The next attempt is the waiting job's run_at (none once sent or given up).
	const nextAttemptAt = sql<
		string | null
	>`(select j.run_at from graphile_worker.jobs j where j.key = 'notice:' || ${notices.id} and j.attempts < j.max_attempts)`;
	const select = () =>
		db.select({ n: notices, lotCode: lots.lotCode, nextAttemptAt }).from(notices).innerJoin(lots, eq(lots.id, notices.lotId));
	const [open, sent] = await Promise.all([
		select()
			.where(inArray(notices.status, ['pending', 'failed']))
			.orderBy(asc(notices.createdAt))
			.limit(500),
		select().where(eq(notices.status, 'sent')).orderBy(desc(notices.sentAt)).limit(sentLimit)
	]);
	const shape = ({ n, lotCode, nextAttemptAt }: { n: OutboxNotice; lotCode: string; nextAttemptAt: string | null }): OutboxRow => ({
		id: n.id,
		lotId: n.lotId,
		lotCode,
		kind: n.kind,
		subject: n.subject,
		recipients: n.recipients,
		status: n.status,
		attempts: n.attempts,
		nextAttemptAt: nextAttemptAt ? new Date(nextAttemptAt).toISOString() : null,
		lastError: n.lastError,
		createdAt: n.createdAt.toISOString(),
		sentAt: n.sentAt?.toISOString() ?? null
	});
	return { open: open.map(shape), sent: sent.map(shape) };
}

/**
 * Admin "retry now" for a notice that gave up: back to pending with a fresh attempt budget and a
 * job due now. Only failed rows qualify: a pending notice already has a job that will run.
 */
export async function retryFailedNotice(db: Database, id: string, actor: { id: string; email: string }): Promise<boolean> {
	return db.transaction(async (tx) => {
		const [row] = await tx
			.update(notices)
			.set({ status: 'pending', attempts: 0 })
			.where(and(eq(notices.id, id), eq(notices.status, 'failed')))
			.returning({ id: notices.id, lotId: notices.lotId });
		if (!row) return false;
		await enqueueNoticeSend(tx, id);
		await recordAudit(tx, {
			actorId: actor.id,
			actorEmail: actor.email,
			action: 'notice.retry',
			entityType: 'notice',
			entityId: id,
			lotId: row.lotId
		});
		return true;
	});
}
