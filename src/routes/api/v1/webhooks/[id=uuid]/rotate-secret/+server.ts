import { json } from '@sveltejs/kit';
import { api, authorize } from '$lib/server/http';
import { getDb } from '$lib/server/db';
import { rotateSecret } from '$lib/server/services/webhooks';
import type { RequestHandler } from './$types';

/** POST /api/v1/webhooks/{id}/rotate-secret — a new signing secret, shown this once; the old one stops at once. */
export const POST: RequestHandler = api(async (event) => {
	const user = authorize(event, 'admin:webhooks');
	return json(await rotateSecret(getDb(), user, event.params.id));
});
