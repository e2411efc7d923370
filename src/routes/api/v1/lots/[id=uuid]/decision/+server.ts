import { json } from '@sveltejs/kit';
import { Forbidden } from '$lib/server/errors';
import { api, readJson } from '$lib/server/http';
import { decideOverride } from '$lib/server/services/decisions';
import { requireLot } from '$lib/server/route-helpers';
import { overrideRequestSchema } from '$lib/schemas/decision';
import type { RequestHandler } from './$types';

/**
 * POST /api/v1/lots/{id}/decision — quality records the material disposition of a lot in review;
 * only then is the supplier notified. An e-signature needs a person at the keyboard: interactive
 * sessions only (API tokens get 403) and the password again.
 * Body: { disposition, due_date?, decision?, reason, password, challenge_id } where challenge_id comes from
 * POST …/decision/challenge for the same lot and decision; a challenge that is unknown, for another
 * lot or decision (422), used, expired, or issued before the lot last changed (409) signs nothing.
 */
export const POST: RequestHandler = api(async (event) => {
	const { user, lot } = await requireLot(event, event.params.id, 'lot:decide');
	if (event.locals.authMethod !== 'session') {
		throw new Forbidden(
			'A quality decision is e-signed: sign in interactively and re-enter your password (API tokens cannot sign)',
			'session_required'
		);
	}
	const { challenge_id: challengeId, due_date: dueDate, ...body } = await readJson(event.request, overrideRequestSchema);
	const outcome = await decideOverride(user, lot.id, { ...body, dueDate, challengeId }, event.getClientAddress());
	return json(outcome);
});
