import { json } from '@sveltejs/kit';
import { databaseIsUp } from '$lib/server/services/health';
import { DATABASE_UNAVAILABLE_MESSAGE } from '$lib/server/http';
import type { RequestHandler } from './$types';

/** Public liveness: 200 when PostgreSQL answers; else 503 with the API's database_unavailable error beside the status. */
export const GET: RequestHandler = async () => {
	if (await databaseIsUp()) return json({ status: 'ok', db: 'ok' });
	const error = { code: 'database_unavailable', message: DATABASE_UNAVAILABLE_MESSAGE };
	return json({ status: 'degraded', db: 'down', error }, { status: 503, headers: { 'retry-after': '2' } });
};
