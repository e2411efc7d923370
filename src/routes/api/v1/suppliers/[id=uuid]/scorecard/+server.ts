import { json } from '@sveltejs/kit';
import { api, authorize, readQuery } from '$lib/server/http';
import { getDb } from '$lib/server/db';
import { supplierScorecard } from '$lib/server/services/scorecards';
import { periodOf, scorecardQuery } from '$lib/schemas/scorecard';
import type { RequestHandler } from './$types';

/** GET /api/v1/suppliers/{id}/scorecard?part_id=&period=&from=&to= — lots, acceptance, holds, rejects, ppm, severity, monthly trend. */
export const GET: RequestHandler = api(async (event) => {
	authorize(event, 'scorecard:read');
	const query = readQuery(event.url, scorecardQuery);
	return json(await supplierScorecard(getDb(), event.params.id, query.part_id, periodOf(query, new Date())));
});
