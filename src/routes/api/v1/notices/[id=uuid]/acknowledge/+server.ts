import { json } from '@sveltejs/kit';
import { api, authorize } from '$lib/server/http';
import { ownOrganisation } from '$lib/server/policy';
import { getDb } from '$lib/server/db';
import { acknowledgeNotice } from '$lib/server/services/notices';
import type { RequestHandler } from './$types';

/** POST /api/v1/notices/{id}/acknowledge — the supplier confirms it read the notice (idempotent). */
export const POST: RequestHandler = api(async (event) => {
	const user = authorize(event, 'notice:acknowledge', ownOrganisation(event.locals.user));
	return json(await acknowledgeNotice(getDb(), user, event.params.id));
});
