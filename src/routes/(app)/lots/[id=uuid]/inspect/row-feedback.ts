// Per-row feedback computed in the browser with the same electrochemistry core the server uses.
// The server's evaluation stays authoritative; this is the inspector's instant check.
import { evaluateReading, type OcvModel } from '$lib/electrochem';
import type { PartLimits } from '$lib/inspection';

export interface BenchContext {
	model: OcvModel;
	cellsInSeries: number;
	declaredSoc: number | null;
	meterAccuracyV: number;
	limits: PartLimits;
	/** SOC limit for an air-shipped lithium-ion lot (the server's air rule), else null. */
	airSocLimit?: number | null;
}

export type FeedbackTone = 'ok' | 'warn' | 'danger' | 'info';

export interface RowFeedback {
	socText: string;
	expectedText: string;
	residualText: string;
	/** Findings as words, each with a shape and tone (never colour alone). */
	findings: Array<{ word: string; shape: string; tone: FeedbackTone }>;
	deepDischarge: boolean;
	indeterminate: boolean;
}

const FLAG_WORDS: Record<string, { word: string; shape: string; tone: FeedbackTone }> = {
	deep_discharge: { word: 'deep discharge', shape: '■', tone: 'danger' },
	over_voltage: { word: 'over voltage', shape: '■', tone: 'danger' },
	soc_indeterminate: { word: 'SOC indeterminate', shape: '◇', tone: 'info' },
	temperature_out_of_range: { word: 'temp. out of range', shape: '▲', tone: 'warn' },
	below_window: { word: 'below model range', shape: '▲', tone: 'warn' },
	above_window: { word: 'above model range', shape: '▲', tone: 'warn' }
};

/** Plausible pack/cell voltage range shown beside the OCV field: the part window × cells in series. */
export function plausibleRange(ctx: BenchContext): [number, number] {
	return [ctx.limits.ocv_min_v * ctx.cellsInSeries, ctx.limits.ocv_max_v * ctx.cellsInSeries];
}

export function feedbackFor(ctx: BenchContext, ocvV: number, temperatureC: number): RowFeedback | null {
	if (!Number.isFinite(ocvV) || !Number.isFinite(temperatureC) || ocvV < 0 || temperatureC <= -60 || temperatureC >= 120) return null;
	let r;
	try {
		r = evaluateReading(ctx.model, { ocv_v: ocvV, temperature_c: temperatureC }, {
			cells_in_series: ctx.cellsInSeries,
			declared_soc: ctx.declaredSoc,
			meter_accuracy_v: ctx.meterAccuracyV
		});
	} catch {
		return null;
	}
	const findings = r.flags.filter((f) => f !== 'below_window' && f !== 'above_window').map((f) => FLAG_WORDS[f]);
	if (r.ocv_at_25c_v < ctx.limits.ocv_min_v || r.ocv_at_25c_v > ctx.limits.ocv_max_v) findings.push({ word: 'outside window', shape: '▲', tone: 'warn' });
	if (r.residual_v !== null && Math.abs(r.residual_v) > ctx.limits.residual_tolerance_v && r.determinate) {
		findings.push({ word: 'far from declared SOC', shape: '▲', tone: 'warn' });
	}
	// Same test as the server's air rule: the unit's SOC interval lies wholly above the limit.
	if (ctx.airSocLimit != null && r.soc_low > ctx.airSocLimit) {
		findings.push({ word: `above ${Math.round(ctx.airSocLimit * 100)} % air limit`, shape: '▲', tone: 'warn' });
	}
	if (findings.length === 0) findings.push({ word: 'in window', shape: '●', tone: 'ok' });
	return {
		socText: r.flags.includes('below_window')
			? 'below range'
			: r.flags.includes('above_window')
				? 'above range'
				: r.determinate
			? `${(r.soc * 100).toFixed(0)} % ± ${(r.soc_sigma * 100).toFixed(0)}`
			: `indeterminate ${(r.soc_low * 100).toFixed(0)}–${(r.soc_high * 100).toFixed(0)} %`,
		expectedText: r.expected_ocv_v === null ? '—' : `${(r.expected_ocv_v * ctx.cellsInSeries).toFixed(ctx.cellsInSeries > 1 ? 2 : 3)} V`,
		residualText: r.residual_v === null ? '—' : `${r.residual_v >= 0 ? '+' : '−'}${Math.abs(r.residual_v * 1000).toFixed(1)} mV`,
		findings,
		deepDischarge: r.flags.includes('deep_discharge'),
		indeterminate: !r.determinate
	};
}
