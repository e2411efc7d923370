// A quality manager approves a stored version, e-signed (password and reason), and not the one who
// fitted it; only approved versions may be chosen for parts.
import { json } from '@sveltejs/kit';
import { api, authorize, conflict, notFound, readJson } from '$lib/server/http';
import { approveModel, getModelVersion } from '$lib/server/services/models';
import { approveModelBody } from '$lib/schemas/electrochem';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = api(async (event) => {
	const user = authorize(event, 'model:approve');
	const body = await readJson(event.request, approveModelBody);
	const outcome = await approveModel(user, event.params.id, body, event.getClientAddress());
	if (outcome === 'not_found') throw notFound('model version');
	if (outcome === 'already_approved') throw conflict('This model version is already approved');
	return json((await getModelVersion(event.params.id))!.version);
});
