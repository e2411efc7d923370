import { json } from '@sveltejs/kit';
import { api } from '$lib/server/http';
import { submitLot } from '$lib/server/services/decisions';
import { requireLot } from '$lib/server/route-helpers';
import type { RequestHandler } from './$types';

/** POST /api/v1/lots/{id}/submit — the engine evaluates the complete sample and decides (→ the evaluation). */
export const POST: RequestHandler = api(async (event) => {
	const { user, lot } = await requireLot(event, event.params.id, 'lot:submit');
	const outcome = await submitLot(user, lot.id);
	return json(outcome, { status: 201 });
});
