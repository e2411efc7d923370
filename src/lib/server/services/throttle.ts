/**
 * Failed sign-ins are counted in PostgreSQL over a sliding window, per account and per client
 * address, so every app process sees the same count. The message never says which key tripped,
 * so it does not reveal whether an account exists.
 */
import { and, eq, gt, inArray, lt, sql } from 'drizzle-orm';
import { getDb } from '../db';
import { signInFailures } from '../db/schema';

/** Per account 5 failures; per address more, because a whole site may share one address. */
export const THROTTLE = { perAccount: 5, perAddress: 20, windowMinutes: 15 } as const;
export const THROTTLED_MESSAGE = 'Too many attempts — wait a few minutes and try again.';

export const accountKey = (email: string) => `account:${email.trim().toLowerCase()}`;
export const addressKey = (address: string) => `address:${address}`;

const windowStart = () => sql`now() - make_interval(mins => ${THROTTLE.windowMinutes})`;

export interface Limit {
	key: string;
	max: number;
}

/** The usual pair: this account and this client address. */
export const signInLimits = (email: string, address: string): Limit[] => [
	{ key: accountKey(email), max: THROTTLE.perAccount },
	{ key: addressKey(address), max: THROTTLE.perAddress }
];

/** A plain string key gets the per-account limit (e.g. an e-signature's `signature:<user id>`). */
const asLimit = (l: Limit | string): Limit => (typeof l === 'string' ? { key: l, max: THROTTLE.perAccount } : l);

/** True when any key has reached its limit inside the window. */
export async function isThrottled(keysOrLimits: Array<Limit | string>): Promise<boolean> {
	const limits = keysOrLimits.map(asLimit);
	const keys = limits.map((l) => l.key);
	const rows = await getDb()
		.select({ key: signInFailures.throttleKey, n: sql<number>`count(*)::int` })
		.from(signInFailures)
		.where(and(inArray(signInFailures.throttleKey, keys), gt(signInFailures.at, windowStart())))
		.groupBy(signInFailures.throttleKey);
	return rows.some((r) => r.n >= limits.find((l) => l.key === r.key)!.max);
}

/** Count one failure against every key, and drop this key's rows that fell out of the window. */
export async function recordFailure(keysOrLimits: Array<Limit | string>): Promise<void> {
	const keys = keysOrLimits.map((l) => asLimit(l).key);
	const db = getDb();
	await db.insert(signInFailures).values(keys.map((throttleKey) => ({ throttleKey })));
	await db.delete(signInFailures).where(and(inArray(signInFailures.throttleKey, keys), lt(signInFailures.at, windowStart())));
}

/** A successful sign-in or password change clears the account's count (not the address's). */
export async function clearFailures(key: string): Promise<void> {
	await getDb().delete(signInFailures).where(eq(signInFailures.throttleKey, key));
}
