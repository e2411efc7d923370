// One reading → SOC with uncertainty, expected OCV at the declared SOC, residual and flags.
//
// Uncertainty, 1σ in V per cell (GUM, JCGM 100:2008, first-order propagation, coverage factor 2):
//   meter:       the meter reads the PACK voltage, so σ_meter,cell = meter_accuracy_v / cells_in_series;
//   temperature: |dU/dT(z)| × the temperature uncertainty (±2 K for a surface probe by default);
//   model:       a single σ_model in V (fitted part models, uncalibrated chemistries), combined with the two above.
// The voltage terms give an interval by inverting OCV ± 2σ through the curve, on the branch the lot's
// last direction names (hysteresis); with the branch unknown, the hull of both branches' intervals. A calibrated chemistry carries its model error in SOC instead
// (sigma_model_soc_curve: how far real cells' own SOC sits from the SOC the generic curve reads at the
// same OCV, calibration/derive.ts), read at the estimate and added in quadrature to each half of that
// interval: half-width = sqrt(voltage half-width² + (2σ_SOC,model)²), clipped to [0, 1].
import { checkCelsius, checkFinite, checkPositiveInteger, checkRange, fail, throwIf } from './errors';
import { NO_INFORMATION_SIGMA, type PreparedModel, invertPrepared, prepareModel, solveWithTemperature } from './invert';
import { entropicMvPerK, entropicShiftV } from './thermal';
import { piecewiseAt } from './piecewise';
import type { EvaluateOptions, FlagCode, LastDirection, OcvModel, ReadingInput, UncertaintyBudget, EvaluatedUnit } from './types';

export const DEFAULT_METER_ACCURACY_V = 0.002;
export const DEFAULT_INDETERMINATE_WIDTH = 0.3;
/** A surface probe on a cell can differ from the cell's inside by about 2 K (common practice). */
export const DEFAULT_TEMPERATURE_UNCERTAINTY_K = 2;

interface ResolvedOptions {
	cells: number;
	declaredSoc: number | null;
	meterSigmaCellV: number;
	/** null: the model's own determinate_width (or the default). */
	width: number | null;
	temperatureSigmaK: number;
	direction: LastDirection;
}

function resolveOptions(opts: EvaluateOptions = {}): ResolvedOptions {
	const cells = opts.cells_in_series ?? 1;
	const declared = opts.declared_soc ?? null;
	const meter = opts.meter_accuracy_v ?? DEFAULT_METER_ACCURACY_V;
	const width = opts.indeterminate_width ?? null;
	const temperatureSigmaK = opts.temperature_uncertainty_k ?? DEFAULT_TEMPERATURE_UNCERTAINTY_K;
	const direction = opts.last_direction ?? 'unknown';
	throwIf(checkPositiveInteger(cells, 'cells_in_series'));
	if (declared !== null) throwIf(checkRange(declared, 0, 1, 'declared_soc'));
	throwIf(checkRange(meter, 0, Number.MAX_VALUE, 'meter_accuracy_v'));
	if (width !== null) throwIf(checkRange(width, 0, 1, 'indeterminate_width'));
	throwIf(checkRange(temperatureSigmaK, 0, 50, 'temperature_uncertainty_k'));
	if (!['after_charge', 'after_discharge', 'unknown'].includes(direction)) {
		throwIf(fail('out_of_range', 'last_direction', 'last_direction must be after_charge, after_discharge or unknown'));
	}
	return { cells, declaredSoc: declared, meterSigmaCellV: meter / cells, width, temperatureSigmaK, direction };
}

function checkReading(reading: ReadingInput): void {
	throwIf(checkFinite(reading.ocv_v, 'ocv_v'));
	if (reading.ocv_v < 0) throwIf(fail('out_of_range', 'ocv_v', 'ocv_v must be >= 0 (check the probe polarity)'));
	throwIf(checkCelsius(reading.temperature_c, 'temperature_c'));
}

function flagsFor(model: OcvModel, ocvCell: number, t_c: number, clamped: 'low' | 'high' | null, determinate: boolean): FlagCode[] {
	const flags: FlagCode[] = [];
	if (ocvCell < model.min_safe_v) flags.push('deep_discharge');
	if (ocvCell > model.max_v) flags.push('over_voltage');
	if (clamped === 'low') flags.push('below_window');
	if (clamped === 'high') flags.push('above_window');
	const [tMin, tMax] = model.temperature_range_c;
	if (t_c < tMin || t_c > tMax) flags.push('temperature_out_of_range');
	if (!determinate) flags.push('soc_indeterminate');
	return flags;
}

/** σ_model in SOC at the estimate z (0 when the model carries its error in volts instead). */
export function modelSigmaSoc(model: OcvModel, z: number): number {
	return model.sigma_model_soc_curve ? piecewiseAt(model.sigma_model_soc_curve, z) : 0;
}

/** σ_model in V: the single number, or none when the error is carried in SOC. */
function modelSigmaV(model: OcvModel): number {
	return model.sigma_model_soc_curve ? 0 : model.sigma_model_v;
}

/** A half-width from the voltage terms and 2σ of the SOC model error, combined in quadrature. */
function widen(voltageHalf: number, sigmaSoc: number): number {
	return Math.hypot(voltageHalf, 2 * sigmaSoc);
}

/** Half the branch gap at z, V (0 without hysteresis). */
function hysteresisHalfV(model: OcvModel, z: number): number {
	return model.hysteresis_half_v ? piecewiseAt(model.hysteresis_half_v, z) : 0;
}

/**
 * Where the reading sits relative to the middle curve, per branch it may be on: after a charge the cell
 * rests on the upper branch (curve + h), so the middle curve is the reading − h; unknown: either branch.
 */
function branchShifts(h: number, direction: LastDirection): number[] {
	if (h === 0) return [0];
	if (direction === 'after_charge') return [-h];
	if (direction === 'after_discharge') return [h];
	return [-h, h];
}

interface SocInterval {
	soc_low: number;
	soc_high: number;
}

/** The 95 % interval on one branch: the voltage terms inverted through the curve, widened by the SOC model error. */
function intervalOnBranch(p: PreparedModel, ocvCell: number, t_c: number, sigmaV: number, shift: number): SocInterval {
	const inv = invertPrepared(p, ocvCell, t_c, sigmaV, { below: 0, above: 0, shift });
	const sigmaSoc = modelSigmaSoc(p.model, inv.soc);
	return {
		soc_low: Math.max(0, inv.soc - widen(inv.soc - inv.soc_low, sigmaSoc)),
		soc_high: Math.min(1, inv.soc + widen(inv.soc_high - inv.soc, sigmaSoc))
	};
}

function inPlateau(model: OcvModel, low: number, high: number): boolean {
	if (!model.plateau) return false;
	const [from, to] = model.plateau;
	return high > from && low < to;
}

function budgetOf(meter: number, model: number, temperature: number, hysteresis: number, plateau: boolean): UncertaintyBudget {
	const parts = { meter, model, temperature } as const;
	const largest = (Object.keys(parts) as Array<keyof typeof parts>).reduce((a, b) => (parts[b] > parts[a] ? b : a));
	return {
		meter_v: meter,
		model_v: model,
		temperature_v: temperature,
		hysteresis_v: hysteresis,
		limited_by: plateau ? 'plateau' : largest
	};
}

function evaluatePrepared(p: PreparedModel, reading: ReadingInput, o: ResolvedOptions): EvaluatedUnit {
	checkReading(reading);
	const model = p.model;
	const t_c = reading.temperature_c;
	const ocvCell = reading.ocv_v / o.cells;
	// the z-dependent terms are read at the estimate from the reading on the middle curve
	const z0 = solveWithTemperature(p, ocvCell, t_c).z;
	const h = hysteresisHalfV(model, z0);
	const shifts = branchShifts(h, o.direction);
	const sigmaT = (Math.abs(entropicMvPerK(p.entropic, z0)) * o.temperatureSigmaK) / 1000;
	const sigmaV = Math.sqrt(o.meterSigmaCellV ** 2 + modelSigmaV(model) ** 2 + sigmaT ** 2);
	// with the branch unknown the interval covers both branches
	const branches = shifts.map((shift) => intervalOnBranch(p, ocvCell, t_c, sigmaV, shift));
	const interval: SocInterval = {
		soc_low: Math.min(...branches.map((b) => b.soc_low)),
		soc_high: Math.max(...branches.map((b) => b.soc_high))
	};
	// the estimate: on the known branch, else on the middle curve with a uniform spread of ±h (σ = h/√3)
	const unknownBranch = shifts.length > 1;
	const shift = unknownBranch ? 0 : shifts[0];
	const inv = invertPrepared(p, ocvCell, t_c, Math.hypot(sigmaV, unknownBranch ? h / Math.sqrt(3) : 0), { below: 0, above: 0, shift });
	const sigmaSoc = modelSigmaSoc(model, inv.soc);
	// the model's share in V at the estimate, for the budget: σ_SOC × dE/dz
	const sigmaModelV = sigmaSoc > 0 ? sigmaSoc * p.fn.slope(inv.soc) : modelSigmaV(model);
	const plateau = inPlateau(model, interval.soc_low, interval.soc_high);
	const width = o.width ?? model.determinate_width ?? DEFAULT_INDETERMINATE_WIDTH;
	const determinate = !plateau && interval.soc_high - interval.soc_low <= width;
	const expected = o.declaredSoc === null ? null : p.fn.value(o.declaredSoc) + entropicShiftV(p.entropic, o.declaredSoc, t_c);
	return {
		soc: inv.soc,
		soc_sigma: Math.min(Math.hypot(inv.soc_sigma, sigmaSoc), NO_INFORMATION_SIGMA),
		soc_low: interval.soc_low,
		soc_high: interval.soc_high,
		determinate,
		ocv_cell_v: ocvCell,
		ocv_at_25c_v: ocvCell - entropicShiftV(p.entropic, inv.soc, t_c),
		expected_ocv_v: expected,
		residual_v: expected === null ? null : ocvCell - expected,
		flags: flagsFor(model, ocvCell, t_c, inv.clamped, determinate),
		uncertainty: budgetOf(o.meterSigmaCellV, sigmaModelV, sigmaT, unknownBranch ? h : 0, plateau)
	};
}

export function evaluateReading(model: OcvModel, reading: ReadingInput, opts?: EvaluateOptions): EvaluatedUnit {
	return evaluatePrepared(prepareModel(model), reading, resolveOptions(opts));
}

/** Same results as evaluateReading in a loop; prepares the model once. */
export function evaluateReadings(model: OcvModel, readings: ReadingInput[], opts?: EvaluateOptions): EvaluatedUnit[] {
	const p = prepareModel(model);
	const o = resolveOptions(opts);
	const out = new Array<EvaluatedUnit>(readings.length);
	for (let i = 0; i < readings.length; i++) out[i] = evaluatePrepared(p, readings[i], o);
	return out;
}
