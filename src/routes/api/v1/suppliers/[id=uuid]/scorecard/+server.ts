import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { api, authorize, readQuery } from '$lib/server/http';
import { getDb } from '$lib/server/db';
import { supplierScorecard } from '$lib/server/services/scorecards';
import type { RequestHandler } from './$types';

const query = z.object({ part_id: z.uuid().optional() });

/** GET /api/v1/suppliers/{id}/scorecard?part_id= — lots, acceptance, holds, rejects, ppm, severity, monthly trend. */
export const GET: RequestHandler = api(async (event) => {
	authorize(event, 'scorecard:read');
	const { part_id } = readQuery(event.url, query);
	return json(await supplierScorecard(getDb(), event.params.id, part_id));
});
