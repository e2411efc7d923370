import { json } from '@sveltejs/kit';
import { api, authorize, readQuery } from '$lib/server/http';
import { ownOrganisation } from '$lib/server/policy';
import { getDb } from '$lib/server/db';
import { traceSerial } from '$lib/server/services/serial-trace';
import { traceQuerySchema } from '$lib/schemas/trace';
import type { RequestHandler } from './$types';

/** GET /api/v1/readings?serial= | serial_prefix= &limit= — a serial trace across the lots the caller may see. */
export const GET: RequestHandler = api(async (event) => {
	// Suppliers trace only their own organisation's lots; the service filters them too.
	const user = authorize(event, 'lot:read', ownOrganisation(event.locals.user));
	const query = readQuery(event.url, traceQuerySchema);
	return json(await traceSerial(getDb(), user, query));
});
