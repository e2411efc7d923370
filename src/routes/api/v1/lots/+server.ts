import { json } from '@sveltejs/kit';
import { api, authorize, readJson, readQuery } from '$lib/server/http';
import { ownOrganisation } from '$lib/server/policy';
import { getDb } from '$lib/server/db';
import { createLot, getLotForUser, listLots, lotJson } from '$lib/server/services/lots';
import { lotApiSchema, lotInputFromApi, lotListQuerySchema } from '$lib/schemas/lot';
import { clientAddress } from '$lib/server/auth';
import type { RequestHandler } from './$types';

/** GET /api/v1/lots?status=&supplier_id=&part_id=&search=&serial=&limit=&cursor= — newest first, keyset pages. */
export const GET: RequestHandler = api(async (event) => {
	const user = event.locals.user;
	// Suppliers read only their own organisation's lots; the service filters them too.
	authorize(event, 'lot:read', ownOrganisation(user));
	const query = readQuery(event.url, lotListQuerySchema);
	const page = await listLots(getDb(), user!, {
		status: query.status,
		supplierId: query.supplier_id,
		partId: query.part_id,
		search: query.search,
		serial: query.serial,
		limit: query.limit,
		cursor: query.cursor
	});
	return json({ lots: page.lots.map(lotJson), next_cursor: page.nextCursor });
});

/** POST /api/v1/lots — register a lot; API registrations are released at once (awaiting arrival). */
export const POST: RequestHandler = api(async (event) => {
	const user = authorize(event, 'lot:create');
	const body = await readJson(event.request, lotApiSchema);
	const db = getDb();
	const created = await createLot(db, user, lotInputFromApi(body), { status: 'awaiting_arrival', ip: clientAddress(event) });
	const view = await getLotForUser(db, user, created.id);
	return json(lotJson(view ?? created), { status: 201, headers: { Location: `/api/v1/lots/${created.id}` } });
});
