import { scaleLinear } from 'd3-scale';
import { describe, expect, it } from 'vitest';
import { decimalsForStep, paddedDomain, voltTicks } from '$lib/components/charts/axis';
import { dodge, evenSample, labelStride, layoutLegend } from '$lib/components/charts/layout';

// Chart helpers have no published reference values; the checks below are arithmetic
// identities and the display habits of DESIGN.md (units on every number, fixed decimals).
// Number formats themselves are tested in tests/unit/format.test.ts.

describe('volt ticks', () => {
	it('adds a fourth decimal only when ticks are closer than 1 mV', () => {
		expect(decimalsForStep(0.01, 3, 4)).toBe(3);
		expect(decimalsForStep(0.001, 3, 4)).toBe(3);
		expect(decimalsForStep(0.0005, 3, 4)).toBe(4);
		expect(decimalsForStep(0.00001, 3, 4)).toBe(4);
		const tight = voltTicks(scaleLinear().domain([3.3, 3.3025]).range([100, 0]), 5).map((t) => t.label);
		expect(new Set(tight).size).toBe(tight.length);
		expect(tight.every((label) => /^3\.30\d\d\u00a0V$/.test(label))).toBe(true);
	});
});

describe('paddedDomain', () => {
	it('covers every value and the requested padding', () => {
		const [lo, hi] = paddedDomain([3.31, 3.28, null, 3.34, undefined], 0.1, 0.01);
		expect(lo).toBeCloseTo(3.28 - 0.006, 9);
		expect(hi).toBeCloseTo(3.34 + 0.006, 9);
	});

	it('widens a single value to the minimum span around it', () => {
		const [lo, hi] = paddedDomain([3.3], 0, 0.01);
		expect(lo).toBeCloseTo(3.295, 9);
		expect(hi).toBeCloseTo(3.305, 9);
	});

	it('handles huge arrays without overflowing the call stack', () => {
		const values = Array.from({ length: 300_000 }, (_, i) => 3 + (i % 1000) / 10_000);
		expect(paddedDomain(values, 0, 0.001)).toEqual([3, 3.0999]);
	});
});

describe('label layout', () => {
	it('dodge keeps the gap, stays inside the bounds and preserves order', () => {
		const placed = dodge([50, 52, 48, 200], 14, 10, 190);
		const sorted = [...placed].sort((a, b) => a - b);
		for (let i = 1; i < sorted.length; i++) expect(sorted[i] - sorted[i - 1]).toBeGreaterThanOrEqual(14 - 1e-9);
		expect(Math.min(...placed)).toBeGreaterThanOrEqual(10);
		expect(Math.max(...placed)).toBeLessThanOrEqual(190);
		// input order kept: 48 was the lowest, so it stays the lowest after spreading
		expect(placed[2]).toBeLessThan(placed[0]);
		expect(placed[0]).toBeLessThan(placed[1]);
	});

	it('evenSample keeps first and last and returns exactly the cap', () => {
		const items = Array.from({ length: 1234 }, (_, i) => i);
		const picked = evenSample(items, 200);
		expect(picked).toHaveLength(200);
		expect(picked[0]).toBe(0);
		expect(picked[199]).toBe(1233);
		expect(new Set(picked).size).toBe(200);
		expect(evenSample(items.slice(0, 5), 200)).toEqual([0, 1, 2, 3, 4]);
	});

	it('labelStride thins labels that would not fit their band', () => {
		expect(labelStride(80, 40)).toBe(1);
		expect(labelStride(20, 40)).toBe(3);
	});

	it('legend wraps into a new row when the width runs out', () => {
		const items = ['accepted', 'held', 'rejected'].map((label) => ({ kind: 'line' as const, label, color: 'currentColor' }));
		expect(layoutLegend(items, 1000, 12).rows).toBe(1);
		const narrow = layoutLegend(items, 90, 12);
		expect(narrow.rows).toBe(3);
		expect(narrow.placed.every((p) => p.x === 0)).toBe(true);
	});
});
