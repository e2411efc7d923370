// One stored model version with its full model JSON.
import { json } from '@sveltejs/kit';
import { api, authorize, notFound } from '$lib/server/http';
import { getModelVersion } from '$lib/server/services/models';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = api(async (event) => {
	authorize(event, 'model:read');
	const found = await getModelVersion(event.params.id);
	if (!found) throw notFound('model version');
	return json({ ...found.version, model: found.model });
});
