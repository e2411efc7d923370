// Lot statistics over per-cell, temperature-corrected OCV values (volts), plus robust outliers and
// self-discharge. All single-pass or sort-based: O(n log n) for 10,000 units.

export interface LotStatistics {
	count: number;
	mean: number | null;
	/** Sample standard deviation (n − 1); null below 2 values. */
	sd: number | null;
	median: number | null;
	/** Raw median absolute deviation (not scaled by 1.4826). */
	mad: number | null;
	min: number | null;
	max: number | null;
	range: number | null;
}

function medianOfSorted(sorted: Float64Array | number[]): number {
	const n = sorted.length;
	const mid = n >> 1;
	return n % 2 === 1 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

/** Median of any array (copies, does not reorder the input). */
export function median(values: readonly number[]): number {
	if (values.length === 0) throw new RangeError('median of an empty list');
	return medianOfSorted(Float64Array.from(values).sort());
}

/** Raw MAD: median of |x − median(x)|. */
export function medianAbsoluteDeviation(values: readonly number[], center = median(values)): number {
	return medianOfSorted(Float64Array.from(values, (v) => Math.abs(v - center)).sort());
}

/** Median and raw MAD of a list, computed once so callers can share them (two sorts in all). */
export interface RobustCentre {
	median: number;
	mad: number;
}

export function robustCentre(values: readonly number[]): RobustCentre {
	const med = median(values);
	return { median: med, mad: medianAbsoluteDeviation(values, med) };
}

/** `centre` (from robustCentre of the same values) saves re-sorting when the caller already has it. */
export function lotStatistics(values: readonly number[], centre?: RobustCentre): LotStatistics {
	const n = values.length;
	if (n === 0) return { count: 0, mean: null, sd: null, median: null, mad: null, min: null, max: null, range: null };
	let sum = 0;
	let min = Infinity;
	let max = -Infinity;
	for (const v of values) {
		sum += v;
		if (v < min) min = v;
		if (v > max) max = v;
	}
	const mean = sum / n;
	let squares = 0;
	for (const v of values) squares += (v - mean) * (v - mean); // two-pass: stable for OCV-sized numbers
	const { median: med, mad } = centre ?? robustCentre(values);
	return {
		count: n,
		mean,
		sd: n >= 2 ? Math.sqrt(squares / (n - 1)) : null,
		median: med,
		mad,
		min,
		max,
		range: max - min
	};
}

/** 1.4826 makes the MAD estimate σ for normally distributed data (1 / Φ⁻¹(0.75)). */
export const MAD_TO_SIGMA = 1.4826;

/**
 * Indices of robust outliers: |x − median| > k · max(1.4826 · MAD, minScale).
 * When more than half the values are identical the MAD is 0; then `minScale` (for OCV: the meter's
 * resolution, e.g. 0.5 mV) is the smallest spread we trust, so values within k·minScale of the
 * median are not flagged. With minScale 0 and MAD 0 any value different from the median is flagged.
 */
export function robustOutliers(values: readonly number[], k = 4, minScale = 0, centre?: RobustCentre): number[] {
	if (values.length < 3) return [];
	const { median: med, mad } = centre ?? robustCentre(values);
	const scale = Math.max(MAD_TO_SIGMA * mad, minScale);
	const limit = k * scale;
	const out: number[] = [];
	values.forEach((v, i) => {
		if (Math.abs(v - med) > limit) out.push(i);
	});
	return out;
}

/** Spread (max − min) in millivolts versus a limit; null when there is nothing to compare. */
export function spreadCheck(values: readonly number[], limitMv: number) {
	if (values.length < 2) return null;
	let min = Infinity;
	let max = -Infinity;
	for (const v of values) {
		if (v < min) min = v;
		if (v > max) max = v;
	}
	const spreadMv = (max - min) * 1000;
	return { spread_mv: spreadMv, limit_mv: limitMv, over: spreadMv > limitMv };
}

export interface TimedVoltage {
	measured_at: string;
	/** Per-cell OCV corrected to 25 °C, volts. */
	ocv_v: number;
}

const DAY_MS = 86_400_000;

/**
 * Self-discharge in mV/day from the earliest and latest readings of one unit, when they are at least
 * 24 h apart; positive = voltage drop. Null when there is no such pair or a timestamp is unreadable.
 */
export function selfDischargeMvPerDay(readings: readonly TimedVoltage[]): number | null {
	return selfDischargeOfParsed(
		readings.map((r) => Date.parse(r.measured_at)),
		readings.map((r) => r.ocv_v)
	);
}

/** selfDischargeMvPerDay for timestamps already parsed to epoch ms (NaN = unreadable); same rules. */
export function selfDischargeOfParsed(times: readonly number[], volts: readonly number[]): number | null {
	let first = -1;
	let last = -1;
	for (let i = 0; i < times.length; i++) {
		const t = times[i];
		if (!Number.isFinite(t)) return null;
		if (first < 0 || t < times[first]) first = i;
		if (last < 0 || t > times[last]) last = i;
	}
	if (first < 0 || times[last] - times[first] < DAY_MS) return null;
	return ((volts[first] - volts[last]) * 1000) / ((times[last] - times[first]) / DAY_MS);
}
