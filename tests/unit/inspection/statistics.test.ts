// Lot statistics checked against simple-statistics 7.12.1 as an outside reference, on seeded random data.
import { describe, expect, it } from 'vitest';
import * as ss from 'simple-statistics';
import { normalSample } from './helpers';
import { lotStatistics, robustOutliers, selfDischargeMvPerDay, spreadCheck } from '../../../src/lib/inspection';

describe('lotStatistics vs simple-statistics', () => {
	for (const [seed, n] of [[1, 7], [2, 8], [3, 125], [4, 1000]] as const) {
		it(`seed ${seed}, n ${n}`, () => {
			const x = normalSample(seed, n, 3.65, 0.004);
			const s = lotStatistics(x);
			expect(s.count).toBe(n);
			expect(s.mean).toBeCloseTo(ss.mean(x), 12);
			expect(s.sd).toBeCloseTo(ss.sampleStandardDeviation(x), 12);
			expect(s.median).toBeCloseTo(ss.median(x), 12);
			// simple-statistics' medianAbsoluteDeviation is the raw median of |x − median| (no 1.4826 factor).
			expect(s.mad).toBeCloseTo(ss.medianAbsoluteDeviation(x), 12);
			expect(s.min).toBe(ss.min(x));
			expect(s.max).toBe(ss.max(x));
			expect(s.range).toBeCloseTo(ss.max(x) - ss.min(x), 12);
		});
	}
	it('empty and single-value lots', () => {
		expect(lotStatistics([]).mean).toBeNull();
		const one = lotStatistics([3.7]);
		expect([one.sd, one.median, one.range]).toEqual([null, 3.7, 0]);
	});
});

describe('robust outliers (|x − median| > k · 1.4826 · MAD)', () => {
	it('flags an injected value and nothing in clean normal data', () => {
		const x = normalSample(9, 200, 3.65, 0.004);
		expect(robustOutliers(x, 5)).toEqual([]);
		const withOutlier = [...x.slice(0, 50), 3.5, ...x.slice(50)];
		expect(robustOutliers(withOutlier, 5)).toEqual([50]);
	});
	it('matches a brute-force count using simple-statistics for the scale', () => {
		const x = normalSample(11, 300, 0, 1);
		const limit = 2 * 1.4826 * ss.medianAbsoluteDeviation(x);
		const m = ss.median(x);
		const expected = x.flatMap((v, i) => (Math.abs(v - m) > limit ? [i] : []));
		expect(expected.length).toBeGreaterThan(0);
		expect(robustOutliers(x, 2)).toEqual(expected);
	});
	it('MAD = 0: the minimum scale decides (documented choice)', () => {
		const x = [3.6, 3.6, 3.6, 3.6, 3.6002, 3.61];
		expect(robustOutliers(x, 4, 0)).toEqual([4, 5]);
		expect(robustOutliers(x, 4, 0.0005)).toEqual([5]);
	});
});

describe('spread and self-discharge', () => {
	it('spread in mV against the limit', () => {
		expect(spreadCheck([3.6, 3.62], 15)).toMatchObject({ over: true });
		expect(spreadCheck([3.6, 3.61], 15)?.spread_mv).toBeCloseTo(10, 9);
	});
	it('earliest and latest readings at least 24 h apart, positive = drop per day', () => {
		const r = [
			{ measured_at: '2025-05-01T08:00:00Z', ocv_v: 3.65 },
			{ measured_at: '2025-05-02T08:00:00Z', ocv_v: 3.648 },
			{ measured_at: '2025-05-03T08:00:00Z', ocv_v: 3.646 }
		];
		expect(selfDischargeMvPerDay(r)).toBeCloseTo(2, 9);
		expect(selfDischargeMvPerDay([...r].reverse())).toBeCloseTo(2, 9);
		expect(selfDischargeMvPerDay(r.slice(0, 1))).toBeNull();
		expect(selfDischargeMvPerDay([r[0], { measured_at: '2025-05-02T07:59:00Z', ocv_v: 3.6 }])).toBeNull();
	});
});
