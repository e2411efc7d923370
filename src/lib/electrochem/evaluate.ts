// One reading → SOC with uncertainty, expected OCV at the declared SOC, residual and flags.
//
// Uncertainty: the meter reads the PACK voltage, so its error divides by the series count just like
// the voltage does: σ_meter,cell = meter_accuracy_v / cells_in_series (meter_accuracy_v taken as 1σ).
// σ_total = sqrt(σ_meter,cell² + σ_model²); σ_SOC = σ_total / |dE/dz|; the interval inverts OCV ± 2σ_total.
import { checkCelsius, checkFinite, checkPositiveInteger, checkRange, fail, throwIf } from './errors';
import { type PreparedModel, invertPrepared, prepareModel } from './invert';
import { entropicShiftV } from './thermal';
import type { EvaluateOptions, FlagCode, OcvModel, ReadingInput, UnitResult } from './types';

export const DEFAULT_METER_ACCURACY_V = 0.002;
export const DEFAULT_INDETERMINATE_WIDTH = 0.3;

interface ResolvedOptions {
	cells: number;
	declaredSoc: number | null;
	meterSigmaCellV: number;
	width: number;
}

function resolveOptions(opts: EvaluateOptions = {}): ResolvedOptions {
	const cells = opts.cells_in_series ?? 1;
	const declared = opts.declared_soc ?? null;
	const meter = opts.meter_accuracy_v ?? DEFAULT_METER_ACCURACY_V;
	const width = opts.indeterminate_width ?? DEFAULT_INDETERMINATE_WIDTH;
	throwIf(checkPositiveInteger(cells, 'cells_in_series'));
	if (declared !== null) throwIf(checkRange(declared, 0, 1, 'declared_soc'));
	throwIf(checkRange(meter, 0, Number.MAX_VALUE, 'meter_accuracy_v'));
	throwIf(checkRange(width, 0, 1, 'indeterminate_width'));
	return { cells, declaredSoc: declared, meterSigmaCellV: meter / cells, width };
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

function evaluatePrepared(p: PreparedModel, reading: ReadingInput, o: ResolvedOptions): UnitResult {
	checkReading(reading);
	const model = p.model;
	const t_c = reading.temperature_c;
	const ocvCell = reading.ocv_v / o.cells;
	const sigma = Math.sqrt(o.meterSigmaCellV ** 2 + model.sigma_model_v ** 2);
	const inv = invertPrepared(p, ocvCell, t_c, sigma);
	const determinate = inv.soc_high - inv.soc_low <= o.width;
	const expected = o.declaredSoc === null ? null : p.fn.value(o.declaredSoc) + entropicShiftV(p.entropic, o.declaredSoc, t_c);
	return {
		soc: inv.soc,
		soc_sigma: inv.soc_sigma,
		soc_low: inv.soc_low,
		soc_high: inv.soc_high,
		determinate,
		ocv_cell_v: ocvCell,
		ocv_at_25c_v: ocvCell - entropicShiftV(p.entropic, inv.soc, t_c),
		expected_ocv_v: expected,
		residual_v: expected === null ? null : ocvCell - expected,
		flags: flagsFor(model, ocvCell, t_c, inv.clamped, determinate)
	};
}

export function evaluateReading(model: OcvModel, reading: ReadingInput, opts?: EvaluateOptions): UnitResult {
	return evaluatePrepared(prepareModel(model), reading, resolveOptions(opts));
}

/** Same results as evaluateReading in a loop; prepares the model once. */
export function evaluateReadings(model: OcvModel, readings: ReadingInput[], opts?: EvaluateOptions): UnitResult[] {
	const p = prepareModel(model);
	const o = resolveOptions(opts);
	const out = new Array<UnitResult>(readings.length);
	for (let i = 0; i < readings.length; i++) out[i] = evaluatePrepared(p, readings[i], o);
	return out;
}
