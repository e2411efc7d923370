import { json } from '@sveltejs/kit';
import { databaseIsUp } from '$lib/server/services/health';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async () => {
	const db = await databaseIsUp();
	return json({ status: db ? 'ok' : 'degraded', db: db ? 'ok' : 'down' }, { status: db ? 200 : 503 });
};
