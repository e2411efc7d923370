/**
 * The scorecard's period (src/lib/schemas/scorecard.ts): what each choice covers, in UTC calendar
 * days, and custom periods refused by name when a day is missing or the order is wrong.
 * "Last 12 months" as the same calendar day a year back is common practice, not a standard.
 */
import { describe, expect, it } from 'vitest';
import { periodOf, periodQuery, scorecardQuery } from '../../src/lib/schemas/scorecard';

const NOW = new Date('2031-05-15T10:05:00Z');

describe('scorecard period', () => {
	it('covers whole UTC days ending today', () => {
		const d90 = periodOf({ period: '90d' }, NOW)!;
		expect(d90.to.toISOString()).toBe('2031-05-16T00:00:00.000Z');
		expect((d90.to.getTime() - d90.from.getTime()) / 86_400_000).toBe(90);
		expect(periodOf({ period: '12m' }, NOW)!.from.toISOString()).toBe('2030-05-16T00:00:00.000Z');
		const custom = periodOf({ period: 'custom', from: '2031-01-01', to: '2031-01-31' }, NOW)!;
		expect([custom.from.toISOString(), custom.to.toISOString()]).toEqual(['2031-01-01T00:00:00.000Z', '2031-02-01T00:00:00.000Z']);
		expect(custom.label).toBe('2031-01-01 to 2031-01-31 (UTC, both days included)');
		expect(periodOf({ period: 'all' }, NOW)).toBeNull();
	});

	it('refuses a custom period without its days or in the wrong order, naming the field', () => {
		const paths = (input: unknown) => {
			const r = periodQuery.safeParse(input);
			return r.success ? [] : r.error.issues.map((i) => i.path.join('.'));
		};
		expect(paths({ period: 'custom' })).toEqual(['from', 'to']);
		expect(paths({ period: 'custom', from: '2031-02-01', to: '2031-01-01' })).toEqual(['to']);
		expect(paths({ period: 'custom', from: '2031-02-30', to: '2031-03-01' })).toEqual(['from']);
		expect(paths({ period: 'weekly' })).toEqual(['period']);
		expect(paths({})).toEqual([]);
		expect(scorecardQuery.safeParse({ part_id: 'x' }).success).toBe(false);
	});
});
