// SOC from OCV. Each model is "prepared" once: its 25 °C curve is tabulated on a uniform grid so a
// reading needs a binary search plus a few safeguarded Newton steps on the exact model. The
// temperature correction is a short fixed-point iteration on the 25 °C curve, so only the
// reference curve (tested monotonic) is ever inverted.
import { REFERENCE_TEMPERATURE_C } from './constants';
import { checkCelsius, checkFinite, fail, throwIf } from './errors';
import { type FormFunctions, formFunctions } from './forms';
import { type EntropicTable, correctTo25C } from './thermal';
import type { InversionResult, OcvModel } from './types';

const TABLE_INTERVALS = 512;
const NEWTON_STEPS = 30;
const SOC_TOLERANCE = 1e-12;
const THERMAL_ITERATIONS = 8;
/** σ of a uniform distribution on [0, 1]: an OCV reading can never leave us less informed than that. */
export const NO_INFORMATION_SIGMA = 1 / Math.sqrt(12);

export interface PreparedModel {
	readonly model: OcvModel;
	readonly fn: FormFunctions;
	readonly table: Float64Array;
	readonly entropic: EntropicTable;
}

export function prepareModel(model: OcvModel): PreparedModel {
	const fn = formFunctions(model);
	const table = new Float64Array(TABLE_INTERVALS + 1);
	for (let i = 0; i <= TABLE_INTERVALS; i++) table[i] = fn.value(i / TABLE_INTERVALS);
	return { model, fn, table, entropic: model.entropic_mv_per_k };
}

/** Largest i with table[i] <= e (table is increasing; caller guarantees table[0] <= e < table[last]). */
function segmentIndex(table: Float64Array, e: number): number {
	let lo = 0;
	let hi = table.length - 1;
	while (hi - lo > 1) {
		const mid = (lo + hi) >> 1;
		if (table[mid] <= e) lo = mid;
		else hi = mid;
	}
	return lo;
}

/** Root of value(z) = e inside [a, b], Newton steps kept inside a shrinking bracket. */
function solveInBracket(fn: FormFunctions, e: number, a: number, b: number, start: number): number {
	let z = start;
	for (let step = 0; step < NEWTON_STEPS; step++) {
		const f = fn.value(z) - e;
		if (f === 0) return z;
		if (f < 0) a = z;
		else b = z;
		const slope = fn.slope(z);
		let next = z - f / slope;
		if (!(next > a && next < b)) next = 0.5 * (a + b);
		if (Math.abs(next - z) < SOC_TOLERANCE) return next;
		z = next;
	}
	return z;
}

/** z in [0, 1] on the 25 °C curve; clamps outside the curve. */
export function invertReference(p: PreparedModel, e: number): number {
	const t = p.table;
	if (!(e > t[0])) return 0;
	if (e >= t[t.length - 1]) return 1;
	const i = segmentIndex(t, e);
	const a = i / TABLE_INTERVALS;
	const b = (i + 1) / TABLE_INTERVALS;
	const start = a + ((e - t[i]) / (t[i + 1] - t[i])) * (b - a);
	return solveInBracket(p.fn, e, a, b, start);
}

/** Fixed point of z = inverse(ocv − (T − 25)·dU/dT(z)): returns z and the 25 °C-equivalent OCV. */
export function solveWithTemperature(p: PreparedModel, ocvV: number, temperatureC: number): { z: number; ocv25: number } {
	let z = invertReference(p, ocvV);
	let ocv25 = ocvV;
	if (temperatureC === REFERENCE_TEMPERATURE_C) return { z, ocv25 };
	for (let k = 0; k < THERMAL_ITERATIONS; k++) {
		ocv25 = correctTo25C(ocvV, p.entropic, z, temperatureC);
		const next = invertReference(p, ocv25);
		const done = Math.abs(next - z) < 1e-10;
		z = next;
		if (done) break;
	}
	return { z, ocv25: correctTo25C(ocvV, p.entropic, z, temperatureC) };
}

/** How far the true 25 °C curve value may sit below and above the corrected reading besides the ±2σ (hysteresis branches), V. */
export interface BranchBand {
	below: number;
	above: number;
	/** Where the reading sits on the model curve: ocv shifted onto the middle curve, V. */
	shift: number;
}
const NO_BAND: BranchBand = { below: 0, above: 0, shift: 0 };

/** Full inversion with σ_SOC (linearised, capped) and the ±2σ interval (widened by the branch band) mapped through the curve. */
export function invertPrepared(
	p: PreparedModel,
	ocvV: number,
	temperatureC: number,
	sigmaV: number,
	band: BranchBand = NO_BAND
): InversionResult {
	const { z, ocv25 } = solveWithTemperature(p, ocvV + band.shift, temperatureC);
	const t = p.table;
	const clamped = ocv25 <= t[0] ? 'low' : ocv25 >= t[t.length - 1] ? 'high' : null;
	const slope = p.fn.slope(z);
	const soc_sigma = slope > 0 ? Math.min(sigmaV / slope, NO_INFORMATION_SIGMA) : NO_INFORMATION_SIGMA;
	return {
		soc: z,
		soc_sigma,
		soc_low: invertReference(p, ocv25 - band.below - 2 * sigmaV),
		soc_high: invertReference(p, ocv25 + band.above + 2 * sigmaV),
		clamped
	};
}

/** Public single-call inversion; sigmaV is the total 1σ per-cell voltage uncertainty. */
export function invertSoc(model: OcvModel, ocvCellV: number, temperatureC: number, sigmaV: number): InversionResult {
	throwIf(checkFinite(ocvCellV, 'ocv_v'));
	throwIf(checkCelsius(temperatureC, 'temperature_c'));
	throwIf(checkFinite(sigmaV, 'sigma_v'));
	if (sigmaV < 0) throwIf(fail('out_of_range', 'sigma_v', 'sigma_v must be >= 0'));
	return invertPrepared(prepareModel(model), ocvCellV, temperatureC, sigmaV);
}
