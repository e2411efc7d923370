/**
 * The throttle's decision rule (services/throttle.ts), without the database: hard limits stop at
 * `max`; per-account back-off lets `free` attempts through, then doubles the wait from 30 s up to
 * 15 minutes — so a stranger's wrong guesses delay a colleague, never lock them out for long.
 * The limits themselves are common practice, not a standard's numbers.
 */
import { describe, expect, it } from 'vitest';
import { accountLimit, addressLimit, allows, backoffSeconds, type Limit } from '$lib/server/services/throttle';

const account = accountLimit('account:someone@example.test') as Extract<Limit, { kind: 'backoff' }>;

describe('hard limit (per client address)', () => {
	const address = addressLimit('192.0.2.7');
	it('allows up to max attempts in the window, then none, however long ago the last was', () => {
		expect(allows(address, { count: 19, secondsSinceLast: 0 })).toBe(true);
		expect(allows(address, { count: 20, secondsSinceLast: 0 })).toBe(false);
		expect(allows(address, { count: 20, secondsSinceLast: 800 })).toBe(false);
	});
});

describe('back-off (per account)', () => {
	it('lets the first five attempts through at once', () => {
		for (let count = 0; count < 5; count++) expect(allows(account, { count, secondsSinceLast: 0 })).toBe(true);
		expect(allows(account, { count: 0, secondsSinceLast: null })).toBe(true);
	});

	it('then waits 30 s, 60 s, 120 s … and never more than 15 minutes', () => {
		expect([5, 6, 7, 8, 9, 10, 11, 40].map((n) => backoffSeconds(account, n))).toEqual([30, 60, 120, 240, 480, 900, 900, 900]);
	});

	it('allows the next attempt once the wait has passed, not before', () => {
		expect(allows(account, { count: 5, secondsSinceLast: 29.9 })).toBe(false);
		expect(allows(account, { count: 5, secondsSinceLast: 30 })).toBe(true);
		expect(allows(account, { count: 30, secondsSinceLast: 899 })).toBe(false);
		expect(allows(account, { count: 30, secondsSinceLast: 900 })).toBe(true);
	});
});
