// Fit Plett's combined model to a reference curve; a rejected fit is a 422 that still carries its
// rmse and the monotonic verdict so the client can show why.
import { json } from '@sveltejs/kit';
import { fitCombinedModel } from '$lib/electrochem';
import { api, authorize, readJson } from '$lib/server/http';
import { fitBody } from '$lib/schemas/electrochem';
import type { RequestHandler } from './$types';

const finiteOrNull = (x: number) => (Number.isFinite(x) ? x : null);

export const POST: RequestHandler = api(async (event) => {
	authorize(event, 'electrochem:use');
	const body = await readJson(event.request, fitBody);
	const fit = fitCombinedModel(body);
	const result = {
		parameters: fit.parameters,
		rmse_v: finiteOrNull(fit.rmse_v),
		max_error_v: finiteOrNull(fit.max_error_v),
		monotonic: fit.monotonic
	};
	if (fit.ok) return json(result);
	const message = `The fit was rejected: ${fit.error ?? 'no acceptable fit'}`;
	return json({ error: { code: 'fit_rejected', message }, ...result }, { status: 422 });
});
