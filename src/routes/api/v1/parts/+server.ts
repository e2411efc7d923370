import { json } from '@sveltejs/kit';
import { api, authorize, readQuery } from '$lib/server/http';
import { getDb } from '$lib/server/db';
import { listParts, partJson } from '$lib/server/services/parts';
import { partListQuerySchema } from '$lib/schemas/part';
import type { RequestHandler } from './$types';

/** GET /api/v1/parts?supplier_id=&chemistry=&search=: parts with limits and sampling settings. */
export const GET: RequestHandler = api(async (event) => {
	authorize(event, 'part:read');
	const query = readQuery(event.url, partListQuerySchema);
	const parts = await listParts(getDb(), query);
	return json({ parts: parts.map(partJson) });
});
