// Stored OCV model versions: list (model:read) and save a new fitted version (model:fit).
import { json } from '@sveltejs/kit';
import { api, authorize, readJson, readQuery } from '$lib/server/http';
import { listModelVersions, saveFittedModel } from '$lib/server/services/models';
import { modelListQuery, saveModelBody } from '$lib/schemas/electrochem';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = api(async (event) => {
	authorize(event, 'model:read');
	const filter = readQuery(event.url, modelListQuery);
	return json(await listModelVersions(filter));
});

export const POST: RequestHandler = api(async (event) => {
	const user = authorize(event, 'model:fit');
	const body = await readJson(event.request, saveModelBody);
	const saved = await saveFittedModel(user, body);
	if (saved.ok) return json(saved.version, { status: 201 });
	const { reason, issues, ...fit } = saved;
	const numbers = { rmse_v: nullIfNaN(fit.rmse_v), max_error_v: nullIfNaN(fit.max_error_v), monotonic: fit.monotonic };
	return json({ error: { code: 'fit_rejected', message: `The fit was rejected: ${reason}`, issues }, ...numbers }, { status: 422 });
});

const nullIfNaN = (x: number) => (Number.isFinite(x) ? x : null);
