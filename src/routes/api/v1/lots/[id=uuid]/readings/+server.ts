import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { getDb } from '$lib/server/db';
import { api, authorize, notFound, readJson } from '$lib/server/http';
import { ownOrganisation } from '$lib/server/policy';
import { getLotForUser } from '$lib/server/services/lots';
import { addReadings, listReadings } from '$lib/server/services/readings';
import type { RequestHandler } from './$types';

// Row shapes are checked by the service (all rows first, then one transaction).
const envelope = z.object({ readings: z.array(z.unknown()) });

/** GET /api/v1/lots/{id}/readings — every stored reading, oldest first. */
export const GET: RequestHandler = api(async (event) => {
	const user = authorize(event, 'lot:read', ownOrganisation(event.locals.user));
	const db = getDb();
	const lot = await getLotForUser(db, user, event.params.id);
	if (!lot) throw notFound('lot');
	authorize(event, 'lot:read', { supplierId: lot.supplierId });
	const readings = await listReadings(db, lot.id);
	return json({ lot_id: lot.id, count: readings.length, readings });
});

/**
 * POST /api/v1/lots/{id}/readings — up to 10,000 readings, all or nothing; 201 {inserted, duplicates,
 * lot_status, arrived, stored: [{client_key, id}] for the rows sent with a client_key}.
 */
export const POST: RequestHandler = api(async (event) => {
	const user = authorize(event, 'reading:write');
	const db = getDb();
	const lot = await getLotForUser(db, user, event.params.id);
	if (!lot) throw notFound('lot');
	authorize(event, 'reading:write', { supplierId: lot.supplierId });
	const body = await readJson(event.request, envelope);
	const source = event.locals.authMethod === 'token' ? 'api' : 'keyboard';
	const result = await addReadings(db, user, lot.id, body.readings, source);
	return json(result, { status: 201 });
});
