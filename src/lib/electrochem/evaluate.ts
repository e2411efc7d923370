// One reading → SOC with uncertainty, expected OCV at the declared SOC, residual and flags.
//
// Uncertainty, 1σ in V per cell (GUM, JCGM 100:2008, first-order propagation, coverage factor 2):
//   meter:       the meter reads the PACK voltage, so σ_meter,cell = meter_accuracy_v / cells_in_series;
//   model:       the spread of real cells around the generic curve, σ_model(z) (calibrated per chemistry);
//   temperature: |dU/dT(z)| × the temperature uncertainty (±2 K for a surface probe by default).
// σ_total = sqrt(σ_meter² + σ_model² + σ_T²); σ_SOC = σ_total / |dE/dz|; the 95 % interval inverts
// OCV ± 2σ_total through the curve, widened by the hysteresis band when the branch is unknown.
import { checkCelsius, checkFinite, checkPositiveInteger, checkRange, fail, throwIf } from './errors';
import { type BranchBand, type PreparedModel, invertPrepared, prepareModel, solveWithTemperature } from './invert';
import { entropicMvPerK, entropicShiftV } from './thermal';
import { piecewiseAt } from './piecewise';
import type { EvaluateOptions, FlagCode, LastDirection, OcvModel, ReadingInput, UncertaintyBudget, EvaluatedUnit } from './types';

export const DEFAULT_METER_ACCURACY_V = 0.002;
export const DEFAULT_INDETERMINATE_WIDTH = 0.3;
/** A surface probe on a cell can the differ from the cell's inside by about 2 K (common practice). */
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

/** σ_model at z: the calibrated curve when the model has one, else its single number. */
export function modelSigmaV(model: OcvModel, z: number): number {
	return model.sigma_model_curve_v ? piecewiseAt(model.sigma_model_curve_v, z) : model.sigma_model_v;
}

/** The largest σ_model over [low, high]: the truth may sit anywhere in the interval (piecewise linear, so ends and nodes suffice). */
function worstModelSigmaV(model: OcvModel, low: number, high: number): number {
	const curve = model.sigma_model_curve_v;
	if (!curve) return model.sigma_model_v;
	const inside = curve.filter(([z]) => z > low && z < high).map(([, v]) => v);
	return Math.max(piecewiseAt(curve, low), piecewiseAt(curve, high), ...inside);
}

const SIGMA_PASSES = 6;

/** Where the 25 °C curve may sit relative to a reading, given the hysteresis branch. */
function branchBand(model: OcvModel, z: number, direction: LastDirection): BranchBand {
	const h = model.hysteresis_half_v ? piecewiseAt(model.hysteresis_half_v, z) : 0;
	if (h === 0) return { below: 0, above: 0, shift: 0 };
	// after a charge the cell rests on the upper branch (curve + h): the middle curve is the reading − h
	if (direction === 'after_charge') return { below: 0, above: 0, shift: -h };
	if (direction === 'after_discharge') return { below: 0, above: 0, shift: h };
	return { below: h, above: h, shift: 0 };
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
	// the z-dependent terms are read at a first estimate from the reading on the middle curve
	const z0 = solveWithTemperature(p, ocvCell, t_c).z;
	const band = branchBand(model, z0, o.direction);
	const sigmaT = (Math.abs(entropicMvPerK(p.entropic, z0)) * o.temperatureSigmaK) / 1000;
	const total = (model_v: number) => Math.sqrt(o.meterSigmaCellV ** 2 + model_v ** 2 + sigmaT ** 2);
	// σ_model varies with z: widen it to the worst value inside the interval until the interval stops growing
	let sigmaModel = modelSigmaV(model, z0);
	let interval = invertPrepared(p, ocvCell, t_c, total(sigmaModel), band);
	for (let pass = 0; pass < SIGMA_PASSES; pass++) {
		const worst = worstModelSigmaV(model, interval.soc_low, interval.soc_high);
		if (worst <= sigmaModel) break;
		sigmaModel = worst;
		interval = invertPrepared(p, ocvCell, t_c, total(sigmaModel), band);
	}
	const sigma = total(sigmaModel);
	// an unknown branch adds a uniform spread of ±h (σ = h/√3) to σ_SOC
	const inv = invertPrepared(p, ocvCell, t_c, Math.hypot(sigma, band.below / Math.sqrt(3)), band);
	const plateau = inPlateau(model, interval.soc_low, interval.soc_high);
	const width = o.width ?? model.determinate_width ?? DEFAULT_INDETERMINATE_WIDTH;
	const determinate = !plateau && interval.soc_high - interval.soc_low <= width;
	const expected = o.declaredSoc === null ? null : p.fn.value(o.declaredSoc) + entropicShiftV(p.entropic, o.declaredSoc, t_c);
	return {
		soc: inv.soc,
		soc_sigma: inv.soc_sigma,
		soc_low: interval.soc_low,
		soc_high: interval.soc_high,
		determinate,
		ocv_cell_v: ocvCell,
		ocv_at_25c_v: ocvCell - entropicShiftV(p.entropic, inv.soc, t_c),
		expected_ocv_v: expected,
		residual_v: expected === null ? null : ocvCell - expected,
		flags: flagsFor(model, ocvCell, t_c, inv.clamped, determinate),
		uncertainty: budgetOf(o.meterSigmaCellV, sigmaModel, sigmaT, band.below, plateau)
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
