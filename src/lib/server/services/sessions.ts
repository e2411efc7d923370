/**
 * Server-side sessions. A browser session lives as long as its row says: 12 hours at most from
 * sign-in, and 2 hours without a request. Sign-out ends the row; a password change and a
 * deactivation end all of the person's rows (and a deactivation revokes their API tokens), so
 * reactivating someone never brings an old cookie or token back to life.
 */
import { and, eq, isNull, ne, sql } from 'drizzle-orm';
import { getDb, type Database, type Tx } from '../db';
import { apiTokens, passwordResets, userSessions, users, verificationTokens } from '../db/schema';
import { toSessionUser } from './users';
import type { SessionUser } from '../../roles';

export const SESSION_LIFETIME_HOURS = 12;
export const SESSION_IDLE_MINUTES = 120;

export type SessionEnd = 'signed_out' | 'password_changed' | 'deactivated' | 'second_factor_changed';

/** A new session row for a person who has just signed in; its id goes into the cookie. */
export async function startSession(userId: string, method: string, ip: string | null): Promise<string> {
	const [row] = await getDb()
		.insert(userSessions)
		.values({ userId, method, ip, expiresAt: sql`now() + make_interval(hours => ${SESSION_LIFETIME_HOURS})` })
		.returning({ id: userSessions.id });
	return row.id;
}

/**
 * The person behind a live session, as stored now (role changes and deactivation take effect at
 * once), or null when the session has ended, expired or been idle too long. Notes the request
 * at most once a minute, which is what keeps an active session from idling out.
 */
export async function sessionUser(sessionId: string): Promise<SessionUser | null> {
	const result = await getDb().execute<{
		id: string;
		email: string;
		name: string | null;
		role: SessionUser['role'];
		organisation_id: string | null;
		stale: boolean;
	}>(sql`
		select u.id, u.email, u.name, u.role::text as role, u.organisation_id,
		       s.last_seen_at < now() - interval '1 minute' as stale
		from ${userSessions} s join ${users} u on u.id = s.user_id and u.active
		where s.id = ${sessionId} and s.ended_at is null and s.expires_at > now()
		  and s.last_seen_at > now() - make_interval(mins => ${SESSION_IDLE_MINUTES})`);
	const row = result.rows[0];
	if (!row) return null;
	if (row.stale) await getDb().update(userSessions).set({ lastSeenAt: new Date() }).where(eq(userSessions.id, sessionId));
	return toSessionUser({ id: row.id, email: row.email, name: row.name, role: row.role, organisationId: row.organisation_id });
}

export async function endSession(sessionId: string, reason: SessionEnd): Promise<void> {
	await getDb()
		.update(userSessions)
		.set({ endedAt: new Date(), endedReason: reason })
		.where(and(eq(userSessions.id, sessionId), isNull(userSessions.endedAt)));
}

/** End every live session of a person (inside the caller's transaction). */
export async function endAllSessions(db: Database | Tx, userId: string, reason: SessionEnd): Promise<void> {
	await db
		.update(userSessions)
		.set({ endedAt: new Date(), endedReason: reason })
		.where(and(eq(userSessions.userId, userId), isNull(userSessions.endedAt)));
}

/** End every live session of a person but the one they act from (inside the caller's transaction). */
export async function endOtherSessions(db: Database | Tx, userId: string, keepSessionId: string | null, reason: SessionEnd): Promise<void> {
	await db
		.update(userSessions)
		.set({ endedAt: new Date(), endedReason: reason })
		.where(
			and(eq(userSessions.userId, userId), isNull(userSessions.endedAt), keepSessionId ? ne(userSessions.id, keepSessionId) : undefined)
		);
}

/** Everything that lets a deactivated person back in: sessions, API tokens, unused links. */
export async function revokeAllAccess(tx: Tx, userId: string, email: string): Promise<void> {
	await endAllSessions(tx, userId, 'deactivated');
	await tx
		.update(apiTokens)
		.set({ revokedAt: new Date() })
		.where(and(eq(apiTokens.userId, userId), isNull(apiTokens.revokedAt)));
	await tx
		.update(passwordResets)
		.set({ usedAt: new Date() })
		.where(and(eq(passwordResets.userId, userId), isNull(passwordResets.usedAt)));
	await tx.delete(verificationTokens).where(eq(verificationTokens.identifier, email));
}
