/**
 * The throttle against the real PostgreSQL, without the app: reservations are atomic, so of many
 * simultaneous attempts exactly the allowed number get through, and giving a reservation back
 * (a success) leaves no trace.
 */
import { describe, expect, it } from 'vitest';
import { accountLimit, addressLimit, clearFailures, releaseAttempt, reserveAttempt } from '$lib/server/services/throttle';
import { useServiceDatabase } from '../helpers/service-db';

const db = useServiceDatabase('svc_throttle', { demo: false });
const rowsFor = async (key: string) =>
	(await db.sql<{ n: number }>('select count(*)::int as n from sign_in_failures where throttle_key = $1', [key]))[0].n;

describe('reserveAttempt', () => {
	it('lets exactly 5 of 50 simultaneous attempts on one account through', async () => {
		const limit = accountLimit('account:parallel@example.test');
		const results = await Promise.all(Array.from({ length: 50 }, () => reserveAttempt([limit])));
		expect(results.filter((r) => r !== null)).toHaveLength(5);
		expect(await rowsFor(limit.key)).toBe(5);
	});

	it('counts a hard limit across keys: the address refuses once it has 20, whichever account', async () => {
		const address = addressLimit('198.51.100.4');
		const results = await Promise.all(
			Array.from({ length: 30 }, (_, i) => reserveAttempt([accountLimit(`account:spray-${i}@example.test`), address]))
		);
		expect(results.filter((r) => r !== null)).toHaveLength(20);
		expect(await rowsFor(address.key)).toBe(20);
		// A refused attempt writes nothing under any of its keys.
		const accounts = await db.sql<{ n: number }>(
			`select count(*)::int as n from sign_in_failures where throttle_key like 'account:spray-%'`
		);
		expect(accounts[0].n).toBe(20);
	});

	it('a released reservation does not count; clearing an account empties its count', async () => {
		const limit = accountLimit('account:released@example.test');
		const reservation = await reserveAttempt([limit]);
		expect(reservation).not.toBeNull();
		await releaseAttempt(reservation!);
		expect(await rowsFor(limit.key)).toBe(0);
		for (let i = 0; i < 3; i++) await reserveAttempt([limit]);
		await clearFailures(limit.key);
		expect(await rowsFor(limit.key)).toBe(0);
	});
});
