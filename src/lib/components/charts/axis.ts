import type { ScaleLinear } from 'd3-scale';
import { count as formatCount, volts } from '$lib/format';
import type { Tick } from './types';

/** Enough decimals that neighbouring ticks never print the same text. */
export function decimalsForStep(step: number, min: number, max: number): number {
	if (!(step > 0) || !Number.isFinite(step)) return min;
	const needed = Math.ceil(-Math.log10(step) - 1e-9);
	return Math.min(max, Math.max(min, needed));
}

/** Ticks of a linear scale, placed and labelled. */
export function linearTicks(scale: ScaleLinear<number, number>, count: number, format: (value: number, step: number) => string): Tick[] {
	const values = scale.ticks(count);
	const step = values.length > 1 ? values[1] - values[0] : 1;
	return values.map((value) => ({ value, pos: Math.round(scale(value) * 100) / 100, label: format(value, step) }));
}

/** Volt ticks with 3 or 4 decimals depending on tick spacing. */
export function voltTicks(scale: ScaleLinear<number, number>, count: number): Tick[] {
	return linearTicks(scale, count, (v, step) => volts(v, decimalsForStep(step, 3, 4)));
}

/** Integer-only ticks for counts (no "0.5 units"). */
export function countTicks(scale: ScaleLinear<number, number>, count: number): Tick[] {
	return linearTicks(scale, count, (v) => formatCount(v)).filter((t) => Number.isInteger(t.value));
}

/**
 * Domain that covers every finite value with `padFraction` of the span on each side.
 * `minSpan` keeps a single value (or a perfectly uniform lot) from collapsing the axis.
 */
export function paddedDomain(values: Array<number | null | undefined>, padFraction: number, minSpan: number): [number, number] {
	const range = extent(values.filter((v): v is number => typeof v === 'number'));
	if (!range) return [0, minSpan];
	let [lo, hi] = range;
	if (hi - lo < minSpan) {
		const mid = (lo + hi) / 2;
		lo = mid - minSpan / 2;
		hi = mid + minSpan / 2;
	}
	const pad = (hi - lo) * padFraction;
	return [lo - pad, hi + pad];
}

/** Min and max of a (possibly huge) array without spreading it onto the call stack. */
export function extent(values: number[]): [number, number] | null {
	let lo = Infinity;
	let hi = -Infinity;
	for (const v of values) {
		if (!Number.isFinite(v)) continue;
		if (v < lo) lo = v;
		if (v > hi) hi = v;
	}
	return lo <= hi ? [lo, hi] : null;
}
