import { json } from '@sveltejs/kit';
import { getDb } from '$lib/server/db';
import { api, authorize, notFound, readJson } from '$lib/server/http';
import { wholeNumberParam } from '$lib/schemas/fields';
import { readingCorrectionSchema } from '$lib/schemas/readings';
import { getLotForUser } from '$lib/server/services/lots';
import { correctReading } from '$lib/server/services/readings';
import type { RequestHandler } from './$types';

/** PATCH /api/v1/lots/{id}/readings/{readingId} — correct a wrong value (with a reason) before the decision. */
export const PATCH: RequestHandler = api(async (event) => {
	const user = authorize(event, 'reading:write');
	const readingId = wholeNumberParam(event.params.readingId);
	if (readingId === null) throw notFound('reading');
	const db = getDb();
	const lot = await getLotForUser(db, user, event.params.id);
	if (!lot) throw notFound('lot');
	const change = await readJson(event.request, readingCorrectionSchema);
	return json(await correctReading(db, user, lot.id, readingId, change));
});
