import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { getDb } from '$lib/server/db';
import { api, readJson } from '$lib/server/http';
import { visibleLot } from '$lib/server/route-helpers';
import { addReadings, listReadings } from '$lib/server/services/readings';
import type { RequestHandler } from './$types';

// Row shapes are checked by the service (all rows first, then one transaction).
const envelope = z.object({ readings: z.array(z.unknown()) });

/** GET /api/v1/lots/{id}/readings — every stored reading, oldest first. */
export const GET: RequestHandler = api(async (event) => {
	const { lot } = await visibleLot(event, event.params.id, 'lot:read');
	const readings = await listReadings(getDb(), lot.id);
	return json({ lot_id: lot.id, count: readings.length, readings });
});

/**
 * POST /api/v1/lots/{id}/readings — up to 10,000 readings, all or nothing; 201 {inserted, duplicates,
 * lot_status, arrived, stored: [{client_key, id}] for the rows sent with a client_key}.
 */
export const POST: RequestHandler = api(async (event) => {
	const { user, lot } = await visibleLot(event, event.params.id, 'reading:write');
	const db = getDb();
	const body = await readJson(event.request, envelope);
	const source = event.locals.authMethod === 'token' ? 'api' : 'keyboard';
	const result = await addReadings(db, user, lot.id, body.readings, source);
	return json(result, { status: 201 });
});
