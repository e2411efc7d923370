// Per-row feedback computed in the browser with the same electrochemistry core the server uses.
// The server's evaluation stays authoritative; this is the inspector's instant check.
import { evaluateReading, type OcvModel } from '$lib/electrochem';
import { formatSocInterval, percent, signedMillivolts, volts } from '$lib/format';
import type { PartLimits } from '$lib/inspection';
import { socStanding } from '$lib/inspection/dangerous-goods';
import { VERDICT, type Look } from '$lib/status';

export interface BenchContext {
	model: OcvModel;
	cellsInSeries: number;
	declaredSoc: number | null;
	meterAccuracyV: number;
	limits: PartLimits;
	/** SOC limit for an air-shipped lithium-ion lot (the server's air rule), else null. */
	airSocLimit?: number | null;
}

/** A finding on one reading: a stable code (for tests and styling hooks) and its look. */
export interface Finding extends Look {
	code: string;
}

export interface RowFeedback {
	socText: string;
	expectedText: string;
	residualText: string;
	/** Findings as words, each with a shape and tone (never colour alone). */
	findings: Finding[];
	deepDischarge: boolean;
	indeterminate: boolean;
}

const refused = (code: string, word: string): Finding => ({ code, word, shape: 'cross', tone: 'reject' });
const attention = (code: string, word: string): Finding => ({ code, word, shape: 'alert', tone: 'hold' });

const FLAG_FINDINGS: Record<string, Finding> = {
	deep_discharge: refused('deep_discharge', 'deep discharge'),
	over_voltage: refused('over_voltage', 'over voltage'),
	soc_indeterminate: { ...VERDICT.indeterminate, code: 'soc_indeterminate', word: 'SOC indeterminate' },
	temperature_out_of_range: attention('temperature_out_of_range', 'temp. out of range'),
	below_window: attention('below_window', 'below model range'),
	above_window: attention('above_window', 'above model range')
};

/** Plausible pack/cell voltage range shown beside the OCV field: the part window × cells in series. */
export function plausibleRange(ctx: BenchContext): [number, number] {
	return [ctx.limits.ocv_min_v * ctx.cellsInSeries, ctx.limits.ocv_max_v * ctx.cellsInSeries];
}

export function feedbackFor(ctx: BenchContext, ocvV: number, temperatureC: number): RowFeedback | null {
	if (!Number.isFinite(ocvV) || !Number.isFinite(temperatureC) || ocvV < 0 || temperatureC <= -60 || temperatureC >= 120) return null;
	let r;
	try {
		r = evaluateReading(
			ctx.model,
			{ ocv_v: ocvV, temperature_c: temperatureC },
			{
				cells_in_series: ctx.cellsInSeries,
				declared_soc: ctx.declaredSoc,
				meter_accuracy_v: ctx.meterAccuracyV
			}
		);
	} catch {
		return null;
	}
	const findings = r.flags.filter((f) => f !== 'below_window' && f !== 'above_window').map((f) => FLAG_FINDINGS[f]);
	if (r.ocv_at_25c_v < ctx.limits.ocv_min_v || r.ocv_at_25c_v > ctx.limits.ocv_max_v)
		findings.push(attention('outside_window', 'outside window'));
	if (r.residual_v !== null && Math.abs(r.residual_v) > ctx.limits.residual_tolerance_v && r.determinate) {
		findings.push(attention('far_from_declared_soc', 'far from declared SOC'));
	}
	// Same test as the server's air rule (socStanding in the inspection core).
	const air = ctx.airSocLimit == null ? 'within' : socStanding(r, ctx.airSocLimit);
	if (air === 'over') findings.push(attention('above_air_limit', `above ${percent(ctx.airSocLimit!)} air limit`));
	if (air === 'unverified') findings.push(attention('air_limit_unverified', `≤ ${percent(ctx.airSocLimit!)} not shown`));
	if (findings.length === 0) findings.push({ ...VERDICT.accept, code: 'in_window', word: 'in window' });
	return {
		socText: r.flags.includes('below_window')
			? 'below range'
			: r.flags.includes('above_window')
				? 'above range'
				: formatSocInterval(r),
		expectedText: r.expected_ocv_v === null ? '—' : volts(r.expected_ocv_v * ctx.cellsInSeries, ctx.cellsInSeries > 1 ? 2 : 3),
		residualText: signedMillivolts(r.residual_v),
		findings,
		deepDischarge: r.flags.includes('deep_discharge'),
		indeterminate: !r.determinate
	};
}
