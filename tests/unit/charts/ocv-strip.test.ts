import { describe, expect, it } from 'vitest';
import { binCountFor, histogram, indexRanges } from '$lib/components/charts/ocv-strip';

describe('OCV histogram and decimation helpers', () => {
	it('counts every finite value exactly once, clamping the ends', () => {
		const bins = histogram([3.285, 3.305, 3.305, 3.315, 3.5, 3.0, NaN], 3.28, 3.32, 4);
		expect(bins.map((b) => b.count)).toEqual([2, 0, 2, 2]);
		expect(bins.reduce((s, b) => s + b.count, 0)).toBe(6);
	});

	it('gives the bulk of the lot about sqrt(n) bars even with a far outlier (square-root rule: common practice)', () => {
		const bulk = Array.from({ length: 100 }, (_, i) => 3.3 + (i / 99) * 0.01);
		const lo = 2.9;
		const hi = 3.32;
		const count = binCountFor([...bulk, 2.95], lo, hi, 500);
		const binWidth = (hi - lo) / count;
		const barsOverBulk = 0.01 / binWidth;
		expect(barsOverBulk).toBeGreaterThanOrEqual(8);
		expect(barsOverBulk).toBeLessThanOrEqual(12);
		expect(binCountFor([...bulk, 2.95], lo, hi, 60)).toBe(60);
	});

	it('indexRanges keeps min and max of each group and skips NaN', () => {
		const ranges = indexRanges([1, 5, 3, NaN, 2, 9, NaN, NaN], 3);
		expect(ranges).toEqual([
			{ first: 0, last: 2, min: 1, max: 5 },
			{ first: 3, last: 5, min: 2, max: 9 }
		]);
	});
});
