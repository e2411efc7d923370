/**
 * The outbox table's state machine, in SQL:
 *
 *   pending ──claim (lease: next_attempt_at = now()+lease, attempts+1)──► sending (still 'pending')
 *   sending ──SMTP accepted──► sent (message_id, sent_at)
 *   sending ──SMTP error──► pending, next_attempt_at = now()+backoff(attempts)   (or 'failed' after N)
 *   sending ──process dies──► lease runs out, claimed again (counted as an attempt)
 *   failed ──admin "retry now"──► pending, attempts 0
 *
 * Delivery is at-least-once: if the process dies after the SMTP server accepted a message and
 * before `markSent` commits, the notice is sent again when its lease runs out. Both copies carry
 * the same Message-ID (<notice-{id}@restvolt.local>), so the duplicate is detectable by the
 * receiving side. Everywhere else a notice is sent exactly once.
 */
import { and, asc, desc, eq, inArray, sql } from 'drizzle-orm';
import type { Database } from '../db';
import { lots, notices } from '../db/schema';
import { recordAudit } from '../services/audit';

export interface OutboxOptions {
	pollMs: number;
	leaseMs: number;
	backoffMs: number;
	backoffMaxMs: number;
	maxAttempts: number;
	batch: number;
}

export function outboxOptionsFromEnv(env: Record<string, string | undefined> = process.env): OutboxOptions {
	const num = (name: string, fallback: number) => {
		const value = Number(env[name]);
		return Number.isFinite(value) && value > 0 ? value : fallback;
	};
	return {
		pollMs: num('OUTBOX_POLL_MS', 2000),
		leaseMs: num('OUTBOX_LEASE_MS', 120_000),
		backoffMs: num('OUTBOX_BACKOFF_MS', 5000),
		backoffMaxMs: num('OUTBOX_BACKOFF_MAX_MS', 3_600_000),
		maxAttempts: num('OUTBOX_MAX_ATTEMPTS', 8),
		batch: 10
	};
}

/** Exponential backoff after the n-th failed attempt (n ≥ 1), capped. */
export function backoffDelayMs(attempts: number, o: Pick<OutboxOptions, 'backoffMs' | 'backoffMaxMs'>): number {
	return Math.min(o.backoffMaxMs, o.backoffMs * 2 ** Math.max(0, attempts - 1));
}

export const noticeMessageId = (id: string) => `<notice-${id}@restvolt.local>`;

export type ClaimedNotice = typeof notices.$inferSelect;

/**
 * Claim due notices for this process: rows locked by another claimer are skipped, and the lease
 * written before commit keeps every other process away while this one sends.
 */
export async function claimDueNotices(db: Database, o: OutboxOptions): Promise<ClaimedNotice[]> {
	return db.transaction(async (tx) => {
		const due = await tx
			.select({ id: notices.id })
			.from(notices)
			.where(and(eq(notices.status, 'pending'), sql`${notices.nextAttemptAt} <= now()`))
			.orderBy(asc(notices.createdAt))
			.limit(o.batch)
			.for('update', { skipLocked: true });
		if (due.length === 0) return [];
		return tx
			.update(notices)
			.set({ attempts: sql`${notices.attempts} + 1`, nextAttemptAt: sql`now() + make_interval(secs => ${o.leaseMs / 1000})` })
			.where(inArray(notices.id, due.map((d) => d.id)))
			.returning();
	});
}

export async function markSent(db: Database, notice: ClaimedNotice, messageId: string, response: string): Promise<void> {
	await db.transaction(async (tx) => {
		await tx
			.update(notices)
			.set({ status: 'sent', messageId, sentAt: new Date(), lastError: null })
			.where(and(eq(notices.id, notice.id), eq(notices.status, 'pending')));
		await recordAudit(tx, {
			action: 'notice.sent',
			entityType: 'notice',
			entityId: notice.id,
			lotId: notice.lotId,
			details: { messageId, response, attempts: notice.attempts, recipients: notice.recipients }
		});
	});
}

/** Record a failed attempt: retry later with backoff, or give up after maxAttempts. */
export async function markAttemptFailed(db: Database, notice: ClaimedNotice, error: string, o: OutboxOptions): Promise<'retry' | 'failed'> {
	const giveUp = notice.attempts >= o.maxAttempts;
	const delay = backoffDelayMs(notice.attempts, o);
	await db
		.update(notices)
		.set(
			giveUp
				? { status: 'failed', lastError: error }
				: { lastError: error, nextAttemptAt: sql`now() + make_interval(secs => ${delay / 1000})` }
		)
		.where(and(eq(notices.id, notice.id), eq(notices.status, 'pending')));
	if (giveUp) {
		await recordAudit(db, { action: 'notice.failed', entityType: 'notice', entityId: notice.id, lotId: notice.lotId, details: { attempts: notice.attempts, error } });
	}
	return giveUp ? 'failed' : 'retry';
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
	nextAttemptAt: string;
	lastError: string | null;
	createdAt: string;
	sentAt: string | null;
}

/** For the admin page: everything not yet sent, then the latest sent ones. */
export async function listOutbox(db: Database, sentLimit = 20): Promise<{ open: OutboxRow[]; sent: OutboxRow[] }> {
	const select = () =>
		db
			.select({ n: notices, lotCode: lots.lotCode })
			.from(notices)
			.innerJoin(lots, eq(lots.id, notices.lotId));
	const [open, sent] = await Promise.all([
		select().where(inArray(notices.status, ['pending', 'failed'])).orderBy(asc(notices.createdAt)).limit(500),
		select().where(eq(notices.status, 'sent')).orderBy(desc(notices.sentAt)).limit(sentLimit)
	]);
	const shape = ({ n, lotCode }: { n: ClaimedNotice; lotCode: string }): OutboxRow => ({
		id: n.id,
		lotId: n.lotId,
		lotCode,
		kind: n.kind,
		subject: n.subject,
		recipients: n.recipients,
		status: n.status,
		attempts: n.attempts,
		nextAttemptAt: n.nextAttemptAt.toISOString(),
		lastError: n.lastError,
		createdAt: n.createdAt.toISOString(),
		sentAt: n.sentAt?.toISOString() ?? null
	});
	return { open: open.map(shape), sent: sent.map(shape) };
}

/**
 * Admin "retry now" for a notice that gave up: back to pending with a fresh attempt budget.
 * Only failed rows qualify: a pending row may be under another process's lease right now.
 */
export async function retryFailedNotice(db: Database, id: string, actor: { id: string; email: string }): Promise<boolean> {
	return db.transaction(async (tx) => {
		const [row] = await tx
			.update(notices)
			.set({ status: 'pending', attempts: 0, nextAttemptAt: sql`now()` })
			.where(and(eq(notices.id, id), eq(notices.status, 'failed')))
			.returning({ id: notices.id, lotId: notices.lotId });
		if (!row) return false;
		await recordAudit(tx, { actorId: actor.id, actorEmail: actor.email, action: 'notice.retry', entityType: 'notice', entityId: id, lotId: row.lotId });
		return true;
	});
}
