import { json } from '@sveltejs/kit';
import { api, authorize, readJson } from '$lib/server/http';
import { getDb } from '$lib/server/db';
import { deleteEndpoint, getEndpoint, setPaused } from '$lib/server/services/webhooks';
import { webhookPatchSchema } from '$lib/schemas/webhook';
import type { RequestHandler } from './$types';

/** GET /api/v1/webhooks/{id} */
export const GET: RequestHandler = api(async (event) => {
	authorize(event, 'admin:webhooks');
	return json(await getEndpoint(getDb(), event.params.id));
});

/** PATCH /api/v1/webhooks/{id} {paused} — a paused endpoint gets no new events. */
export const PATCH: RequestHandler = api(async (event) => {
	const user = authorize(event, 'admin:webhooks');
	const { paused } = await readJson(event.request, webhookPatchSchema);
	return json(await setPaused(getDb(), user, event.params.id, paused));
});

/** DELETE /api/v1/webhooks/{id} — with its delivery log. */
export const DELETE: RequestHandler = api(async (event) => {
	const user = authorize(event, 'admin:webhooks');
	await deleteEndpoint(getDb(), user, event.params.id);
	return new Response(null, { status: 204 });
});
