// The browser-side fit preview: the same core the server uses, run on every edit of the pasted curve.
import { curve, fitCombinedModel, ocvAt, type OcvModel } from '$lib/electrochem';
import type { ParsedCurve } from './reference-csv';

export interface FitPreview {
	ok: boolean;
	reason: string | null;
	rmse_v: number;
	max_error_v: number;
	monotonic: boolean;
	parameters: Record<string, number>;
	/** fitted curve at the displayed temperature, for the overlay */
	curve: Array<{ soc: number; ocv_v: number }>;
	/** reference points: measured, fitted at the reference temperature, residual (measured − fitted) */
	rows: Array<{ soc: number; measured_v: number; fitted_v: number; residual_mv: number }>;
}

const MIN_POINTS = 6;

/** A model with the fitted parameters even when the fit was rejected, so the overlay shows why. */
function fittedShape(base: OcvModel, parameters: Record<string, number>): OcvModel {
	return { ...base, form: 'combined', params: parameters };
}

export function previewFit(base: OcvModel, parsed: ParsedCurve, referenceC: number, displayC: number): FitPreview | null {
	if (parsed.errors.length > 0 || parsed.points.length < MIN_POINTS || !Number.isFinite(referenceC)) return null;
	const fit = fitCombinedModel({ chemistry: base.chemistry, temperature_c: referenceC, points: parsed.points });
	const hasParams = Object.keys(fit.parameters).length > 0;
	const shape = fit.model ?? (hasParams ? fittedShape(base, fit.parameters) : null);
	const rows = shape
		? parsed.points.map((p) => {
				const fitted = ocvAt(shape, p.soc, referenceC);
				return { soc: p.soc, measured_v: p.ocv_v, fitted_v: fitted, residual_mv: (p.ocv_v - fitted) * 1000 };
			})
		: [];
	return {
		ok: fit.ok,
		reason: fit.error ?? null,
		rmse_v: fit.rmse_v,
		max_error_v: fit.max_error_v,
		monotonic: fit.monotonic,
		parameters: fit.parameters,
		curve: shape && Number.isFinite(displayC) ? curve(shape, displayC, 101) : [],
		rows
	};
}
