import { json } from '@sveltejs/kit';
import { api } from '$lib/server/http';
import { decisionTrail } from '$lib/server/services/decision-history';
import { requireLot } from '$lib/server/route-helpers';
import { getDb } from '$lib/server/db';
import type { RequestHandler } from './$types';

/** GET /api/v1/lots/{id}/decisions — evaluations, decisions, notices and replies (the decision panel). */
export const GET: RequestHandler = api(async (event) => {
	const { user, lot } = await requireLot(event, event.params.id, 'lot:read');
	return json(await decisionTrail(getDb(), user, lot));
});
