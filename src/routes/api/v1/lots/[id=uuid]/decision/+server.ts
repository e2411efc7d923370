import { json } from '@sveltejs/kit';
import { ApiError, api, readJson } from '$lib/server/http';
import { decideOverride } from '$lib/server/services/decisions';
import { requireLot } from '$lib/server/services/portal';
import { overrideSchema } from '$lib/schemas/decision';
import type { RequestHandler } from './$types';

/**
 * POST /api/v1/lots/{id}/decision — quality releases or rejects a held lot. An e-signature needs a
 * person at the keyboard: interactive sessions only (API tokens get 403) and the password again.
 */
export const POST: RequestHandler = api(async (event) => {
	const { user, lot } = await requireLot(event, event.params.id, 'lot:decide');
	if (event.locals.authMethod !== 'session') {
		throw new ApiError(403, 'session_required', 'A quality decision is e-signed: sign in interactively and re-enter your password (API tokens cannot sign)');
	}
	const body = await readJson(event.request, overrideSchema);
	const outcome = await decideOverride(user, lot.id, body, event.getClientAddress());
	return json(outcome);
});
