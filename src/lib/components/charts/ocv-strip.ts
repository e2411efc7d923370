import { extent } from './axis';

export interface OcvUnit {
	serial: string;
	ocv_at_25c_v: number;
	nonconforming: boolean;
	outlier?: boolean;
}

/** Above this many units the strip shows min–max strokes instead of one marker per unit. */
export const DETAIL_LIMIT = 1500;
/** Cap on individually drawn flagged units in summary mode. */
export const FLAGGED_LIMIT = 300;

export interface HistogramBin {
	lo: number;
	hi: number;
	count: number;
}

/** Equal-width bins over [lo, hi]; values outside are clamped into the end bins. */
export function histogram(values: number[], lo: number, hi: number, binCount: number): HistogramBin[] {
	const width = (hi - lo) / binCount;
	const bins = Array.from({ length: binCount }, (_, i) => ({ lo: lo + i * width, hi: lo + (i + 1) * width, count: 0 }));
	for (const v of values) {
		if (!Number.isFinite(v)) continue;
		const i = Math.min(binCount - 1, Math.max(0, Math.floor((v - lo) / width)));
		bins[i].count += 1;
	}
	return bins;
}

/**
 * Bins over the whole axis [lo, hi], sized so the bulk of the lot (5th–95th percentile)
 * spreads over about sqrt(n) bars (5–30); an outlier far away then cannot squash the bulk
 * into a single bar. Capped so every bar stays a few pixels tall.
 */
export function binCountFor(values: number[], lo: number, hi: number, maxBins = 80): number {
	const sorted = values.filter(Number.isFinite).sort((a, b) => a - b);
	if (sorted.length < 2 || !(hi > lo)) return 10;
	const pick = (q: number) => sorted[Math.round(q * (sorted.length - 1))];
	const bulk = sorted.length >= 20 ? pick(0.95) - pick(0.05) : sorted[sorted.length - 1] - sorted[0];
	const bars = Math.min(30, Math.max(5, Math.round(Math.sqrt(sorted.length))));
	if (!(bulk > 0)) return maxBins;
	return Math.min(maxBins, Math.max(bars, Math.ceil(((hi - lo) / bulk) * bars)));
}

export interface IndexRange {
	first: number;
	last: number;
	min: number;
	max: number;
}

/** Consecutive groups of `size` units (in measurement order) with their OCV extremes; NaN entries (units drawn on their own) are skipped. */
export function indexRanges(values: number[], size: number): IndexRange[] {
	const ranges: IndexRange[] = [];
	for (let first = 0; first < values.length; first += size) {
		const last = Math.min(values.length, first + size) - 1;
		const span = extent(values.slice(first, last + 1));
		if (span) ranges.push({ first, last, min: span[0], max: span[1] });
	}
	return ranges;
}
