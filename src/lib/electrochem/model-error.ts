// What to say about a model's own error where a lot page or a report names the model: its σ in V
// (a fitted part model's cross-validated σ, or an uncalibrated chemistry's number), or, for a
// chemistry calibrated in SOC against published cells, the largest of its SOC σ values. Saying
// "5 mV" for a curve whose error is carried in SOC would be a number nothing uses.
import type { OcvModel } from './types';

export interface ModelErrorSummary {
	/** 1σ, V per cell */
	sigma_model_v?: number;
	/** The largest 1σ of the SOC model error over 0–100 %, SOC fraction. */
	sigma_model_soc_max?: number;
}

export function modelErrorSummary(model: Pick<OcvModel, 'sigma_model_v' | 'sigma_model_soc_curve'>): ModelErrorSummary {
	const curve = model.sigma_model_soc_curve;
	if (curve && curve.length > 0) return { sigma_model_soc_max: Math.max(...curve.map(([, s]) => s)) };
	return { sigma_model_v: model.sigma_model_v };
}
