/**
 * Throttles for sign-in, e-mailed links and e-signatures, kept in PostgreSQL so every app process
 * sees the same count. An attempt is *reserved* before the password is checked: under a
 * transaction-scoped advisory lock per key, the attempts in the window are counted and, when the
 * limits allow it, a row is added for each key. Parallel requests therefore queue on the lock and
 * see each other's reservations; a hundred simultaneous guesses cannot all reach the hash check.
 * A success gives its reservation back (and clears the account's count); a failure keeps it.
 *
 * Two kinds of limit:
 * - hard (per client address, per e-mail for link requests): `max` attempts per window, then no more;
 * - backoff (per account, per signer): `free` attempts, then each further one waits twice as long as
 *   the one before, capped — a stranger typing wrong passwords slows a colleague down for at most
 *   `capSeconds`, never locks the account outright.
 * The message never says which key tripped, so it does not reveal whether an account exists.
 */
import { and, inArray, lt, sql } from 'drizzle-orm';
import { getDb, type Tx } from '../db';
import { signInFailures } from '../db/schema';

export const THROTTLED_MESSAGE = 'Too many attempts — wait a few minutes and try again.';

export type Limit =
	| { key: string; kind: 'hard'; max: number; windowMinutes: number }
	| { key: string; kind: 'backoff'; free: number; firstWaitSeconds: number; capSeconds: number; windowMinutes: number };

/** Per account: 5 free attempts, then 30 s, 1 min, 2 min … up to 15 min between attempts; remembered a day. */
export const accountLimit = (key: string): Limit => ({
	key,
	kind: 'backoff',
	free: 5,
	firstWaitSeconds: 30,
	capSeconds: 15 * 60,
	windowMinutes: 24 * 60
});
/** Per client address: 20 failures in 15 minutes (a whole site may share one address). */
export const addressLimit = (address: string): Limit => ({ key: `address:${address}`, kind: 'hard', max: 20, windowMinutes: 15 });

export const accountKey = (email: string) => `account:${email.trim().toLowerCase()}`;

/** The usual pair for a password check: this account and this client address. */
export const signInLimits = (email: string, address: string): Limit[] => [accountLimit(accountKey(email)), addressLimit(address)];

/** How the attempts already counted under one key stand. */
export interface KeyState {
	count: number;
	/** Seconds since the newest counted attempt; null when there is none. */
	secondsSinceLast: number | null;
}

/** Seconds the next attempt under a backoff limit must wait after the newest one (0: none). */
export function backoffSeconds(limit: Extract<Limit, { kind: 'backoff' }>, count: number): number {
	if (count < limit.free) return 0;
	return Math.min(limit.capSeconds, limit.firstWaitSeconds * 2 ** (count - limit.free));
}

/** Pure decision: may one more attempt be made under this limit now? */
export function allows(limit: Limit, state: KeyState): boolean {
	if (limit.kind === 'hard') return state.count < limit.max;
	const wait = backoffSeconds(limit, state.count);
	return wait === 0 || state.secondsSinceLast === null || state.secondsSinceLast >= wait;
}

/** The ids of the rows an allowed attempt added; give them back with `releaseAttempt` on success. */
export interface Reservation {
	ids: string[];
}

async function keyState(tx: Tx, limit: Limit): Promise<KeyState> {
	const result = await tx.execute<{ n: number; since: number | null }>(sql`
		select count(*)::int as n, extract(epoch from now() - max(at))::float8 as since
		from sign_in_failures
		where throttle_key = ${limit.key} and at > now() - make_interval(mins => ${limit.windowMinutes})`);
	const row = result.rows[0];
	return { count: row.n, secondsSinceLast: row.since };
}

/**
 * Reserve one attempt under every limit, atomically; null when any limit refuses (nothing is
 * written then). Keys are locked in a fixed order so two reservations never deadlock.
 */
export async function reserveAttempt(limits: Limit[]): Promise<Reservation | null> {
	const sorted = [...limits].sort((a, b) => a.key.localeCompare(b.key));
	return getDb().transaction(async (tx) => {
		for (const limit of sorted) await tx.execute(sql`select pg_advisory_xact_lock(hashtextextended(${limit.key}, 0))`);
		for (const limit of sorted) {
			if (!allows(limit, await keyState(tx, limit))) return null;
		}
		const rows = await tx
			.insert(signInFailures)
			.values(sorted.map((l) => ({ throttleKey: l.key })))
			.returning({ id: signInFailures.id });
		const longest = Math.max(...sorted.map((l) => l.windowMinutes));
		await tx.delete(signInFailures).where(
			and(
				inArray(
					signInFailures.throttleKey,
					sorted.map((l) => l.key)
				),
				lt(signInFailures.at, sql`now() - make_interval(mins => ${longest})`)
			)
		);
		return { ids: rows.map((r) => r.id) };
	});
}

/** The attempt succeeded: it does not count against the address or the account. */
export async function releaseAttempt(reservation: Reservation): Promise<void> {
	if (reservation.ids.length) await getDb().delete(signInFailures).where(inArray(signInFailures.id, reservation.ids));
}

/** A successful sign-in or password change clears the account's count (not the address's). */
export async function clearFailures(key: string): Promise<void> {
	await getDb()
		.delete(signInFailures)
		.where(sql`${signInFailures.throttleKey} = ${key}`);
}
