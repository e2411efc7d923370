// Lot statistics (computed with simple-statistics) checked against values that do not come from that
// package: the certified values of NIST's Statistical Reference Datasets (StRD, univariate summary
// statistics, NumAcc1 and NumAcc3: mean and standard deviation; from memory), and small examples
// worked out by hand below.
import { describe, expect, it } from 'vitest';
import { normalSample } from './helpers';
import { lotStatistics, median, robustCentre, robustOutliers, selfDischargeMvPerDay, spreadCheck } from '../../../src/lib/inspection';

/** NIST StRD NumAcc3: 1000000.2, then 500 pairs of 1000000.1 and 1000000.3 (1001 values). */
const NUM_ACC_3 = [1000000.2, ...Array.from({ length: 500 }, () => [1000000.1, 1000000.3]).flat()];

describe('lotStatistics against certified and hand-worked values', () => {
	it('NIST StRD NumAcc1 (10000001, 10000003, 10000002): certified mean 10000002, standard deviation 1', () => {
		const s = lotStatistics([10000001, 10000003, 10000002]);
		expect(s.mean).toBe(10000002);
		expect(s.sd).toBeCloseTo(1, 12);
		expect(s.median).toBe(10000002);
	});

	it('NIST StRD NumAcc3 (1001 values near 10⁶, spread 0.1): certified mean 1000000.2, standard deviation 0.1', () => {
		const s = lotStatistics(NUM_ACC_3);
		expect(s.count).toBe(1001);
		expect(s.mean).toBeCloseTo(1000000.2, 8);
		// The set exists to test the variance's numerical accuracy at a large offset.
		expect(s.sd).toBeCloseTo(0.1, 8);
		expect(s.mad).toBeCloseTo(0.1, 8); // one deviation of 0, a thousand of 0.1
	});

	it('five OCV values, worked by hand', () => {
		// 3.61 3.62 3.60 3.63 3.64: mean 3.62; squared deviations 1e-4 + 0 + 4e-4 + 1e-4 + 4e-4 = 1e-3,
		// s = √(1e-3 / 4) = 0.015811388300841896; sorted, the middle value is 3.62; |x − 3.62| sorted
		// is 0, 0.01, 0.01, 0.02, 0.02, so MAD = 0.01.
		const s = lotStatistics([3.61, 3.62, 3.6, 3.63, 3.64]);
		expect(s.count).toBe(5);
		expect(s.mean).toBeCloseTo(3.62, 14);
		expect(s.sd).toBeCloseTo(0.015811388300841896, 14);
		expect(s.median).toBe(3.62);
		expect(s.mad).toBeCloseTo(0.01, 14);
		expect([s.min, s.max]).toEqual([3.6, 3.64]);
		expect(s.range).toBeCloseTo(0.04, 14);
	});

	it('an even count takes the mean of the two middle values, for the median and for the MAD', () => {
		// 3.60 3.61 3.63 3.70: median (3.61 + 3.63) / 2 = 3.62; |x − 3.62| = 0.02 0.01 0.01 0.08 → MAD (0.01 + 0.02) / 2.
		expect(robustCentre([3.7, 3.6, 3.63, 3.61]).median).toBeCloseTo(3.62, 14);
		expect(robustCentre([3.7, 3.6, 3.63, 3.61]).mad).toBeCloseTo(0.015, 14);
	});

	it('leaves the input in its order; empty and single-value lots', () => {
		const x = [3.7, 3.6, 3.65];
		expect(median(x)).toBe(3.65);
		expect(x).toEqual([3.7, 3.6, 3.65]);
		expect(() => median([])).toThrow(RangeError);
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
	it('1 1 2 2 4 6 9, worked by hand: median 2, MAD 1, so the scale is 1.4826', () => {
		// |x − 2| = 1 1 0 0 2 4 7. k = 2: limit 2.9652 → the 4 and the 7 (indices 5, 6); k = 3: limit 4.4478 → only the 7.
		const x = [1, 1, 2, 2, 4, 6, 9];
		expect(robustCentre(x)).toEqual({ median: 2, mad: 1 });
		expect(robustOutliers(x, 2)).toEqual([5, 6]);
		expect(robustOutliers(x, 3)).toEqual([6]);
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
