import { json } from '@sveltejs/kit';
import { Forbidden } from '$lib/server/errors';
import { api, readJson } from '$lib/server/http';
import { getDb } from '$lib/server/db';
import { requireLot } from '$lib/server/route-helpers';
import { challengeJson, issueChallenge } from '$lib/server/services/signature-challenges';
import { challengeRequestSchema } from '$lib/schemas/decision';
import type { RequestHandler } from './$types';

/**
 * POST /api/v1/lots/{id}/decision/challenge — body { decision: "accept" | "reject" } → 201
 * { challenge_id, lot_id, lot_code, revision, decision, meaning, expires_at }: a single-use
 * challenge for e-signing that decision on the held lot as it stands now. Send its challenge_id
 * with POST …/decision. Interactive sessions only, like the signature itself.
 */
export const POST: RequestHandler = api(async (event) => {
	const { user, lot } = await requireLot(event, event.params.id, 'lot:decide');
	if (event.locals.authMethod !== 'session') {
		throw new Forbidden(
			'A quality decision is e-signed: sign in interactively to ask for a signing challenge (API tokens cannot sign)',
			'session_required'
		);
	}
	const { decision } = await readJson(event.request, challengeRequestSchema);
	const challenge = await issueChallenge(getDb(), user, lot.id, decision);
	return json(challengeJson(challenge), { status: 201 });
});
