import { json } from '@sveltejs/kit';
import { api, authorize, readQuery } from '$lib/server/http';
import { ownOrganisation } from '$lib/server/policy';
import { getDb } from '$lib/server/db';
import { listNotices } from '$lib/server/services/notices';
import { requireLot } from '$lib/server/route-helpers';
import { noticesQuery } from '$lib/schemas/decision';
import type { RequestHandler } from './$types';

/** GET /api/v1/notices?lot_id= — notices to suppliers (a supplier sees only its own). */
export const GET: RequestHandler = api(async (event) => {
	const user = authorize(event, 'notice:read', ownOrganisation(event.locals.user));
	const query = readQuery(event.url, noticesQuery);
	if (query.lot_id) await requireLot(event, query.lot_id, 'notice:read');
	return json({ notices: await listNotices(getDb(), user, { lotId: query.lot_id }) });
});
