import { json } from '@sveltejs/kit';
import { api, authorize } from '$lib/server/http';
import { getDb } from '$lib/server/db';
import { listDeliveries } from '$lib/server/services/webhooks';
import type { RequestHandler } from './$types';

/** GET /api/v1/webhooks/{id}/deliveries — the latest 100 deliveries, newest first. */
export const GET: RequestHandler = api(async (event) => {
	authorize(event, 'admin:webhooks');
	return json({ deliveries: await listDeliveries(getDb(), event.params.id) });
});
