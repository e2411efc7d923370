import { json } from '@sveltejs/kit';
import { api, authorize, readJson } from '$lib/server/http';
import { getDb } from '$lib/server/db';
import { createEndpoint, listEndpoints } from '$lib/server/services/webhooks';
import { webhookCreateSchema } from '$lib/schemas/webhook';
import type { RequestHandler } from './$types';

/** GET /api/v1/webhooks — the registered endpoints (never their secrets). */
export const GET: RequestHandler = api(async (event) => {
	authorize(event, 'admin:webhooks');
	return json({ webhooks: await listEndpoints(getDb()) });
});

/** POST /api/v1/webhooks {url, events} — register; the answer carries the signing secret, this once. */
export const POST: RequestHandler = api(async (event) => {
	const user = authorize(event, 'admin:webhooks');
	const body = await readJson(event.request, webhookCreateSchema);
	const created = await createEndpoint(getDb(), user, body);
	return json(created, { status: 201, headers: { Location: `/api/v1/webhooks/${created.id}` } });
});
