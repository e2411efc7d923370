// Fit a part model to the supplier's OCV points: form 'nernst' (combined, Nernst-type), 'tabulated'
// (Steffen's monotone interpolant) or 'auto' (whichever cross-validates better). Nothing is stored:
// the answer's `model` can be sent back to /ocv/evaluate, and POST /models stores a version.
import { json } from '@sveltejs/kit';
import { fitPartModel } from '$lib/electrochem';
import { Invalid } from '$lib/server/errors';
import { api, authorize, readJson } from '$lib/server/http';
import { fitBody } from '$lib/schemas/electrochem';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = api(async (event) => {
	authorize(event, 'electrochem:use');
	const body = await readJson(event.request, fitBody);
	const fit = fitPartModel(body);
	if (!fit.ok) throw new Invalid(fit.message, fit.issues, fit.code === 'invalid_points' ? undefined : fit.code);
	return json({
		form: fit.form,
		model: fit.model,
		rmse_v: fit.rmse_v,
		max_error_v: fit.max_error_v,
		monotonic: fit.monotonic,
		sigma_model_v: fit.sigma_model_v,
		cv_rmse_v: fit.cv_rmse_v,
		smoothed: fit.smoothed,
		candidates: fit.candidates,
		curve_temperature_c: body.temperature_c,
		curve: fit.curve
	});
});
