// Lot statistics over per-cell, temperature-corrected OCV values (volts), plus robust outliers and
// self-discharge. Mean, σ, median and MAD come from simple-statistics (pure, no I/O); its median
// selects instead of sorting, so each is O(n) for 10,000 units.
import { extent, mean, median as medianOf, medianAbsoluteDeviation, sampleStandardDeviation } from 'simple-statistics';

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

/** Median of any array (the input is not reordered). */
export function median(values: readonly number[]): number {
	if (values.length === 0) throw new RangeError('median of an empty list');
	return medianOf(values);
}

/** Median and raw MAD (median of |x − median|, no 1.4826 factor) of a list, computed once so callers can share them. */
export interface RobustCentre {
	median: number;
	mad: number;
}

export function robustCentre(values: readonly number[]): RobustCentre {
	return { median: median(values), mad: medianAbsoluteDeviation(values) };
}

/** `centre` (from robustCentre of the same values) saves computing it again when the caller already has it. */
export function lotStatistics(values: readonly number[], centre?: RobustCentre): LotStatistics {
	const n = values.length;
	if (n === 0) return { count: 0, mean: null, sd: null, median: null, mad: null, min: null, max: null, range: null };
	const [min, max] = extent(values);
	const { median: med, mad } = centre ?? robustCentre(values);
	return {
		count: n,
		mean: mean(values),
		sd: n >= 2 ? sampleStandardDeviation(values) : null,
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
	const [min, max] = extent(values);
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
