import { json } from '@sveltejs/kit';
import { getDb } from '$lib/server/db';
import { api, authorize, notFound } from '$lib/server/http';
import { evaluateLotNow } from '$lib/server/services/evaluation';
import { getLotForUser } from '$lib/server/services/lots';
import type { RequestHandler } from './$types';

/**
 * GET /api/v1/lots/{id}/evaluation — the disposition computed now from the stored readings.
 * `?detail=summary` leaves out the per-unit results and the inputs snapshot (the bench polls it).
 */
export const GET: RequestHandler = api(async (event) => {
	const user = authorize(event, 'lot:read', event.locals.user?.role === 'supplier' ? { supplierId: event.locals.user.organisationId } : undefined);
	const db = getDb();
	const lot = await getLotForUser(db, user, event.params.id);
	if (!lot) throw notFound('lot');
	authorize(event, 'lot:read', { supplierId: lot.supplierId });
	const started = performance.now();
	const evaluation = await evaluateLotNow(db, lot.id);
	const headers = { 'server-timing': `evaluate;dur=${(performance.now() - started).toFixed(1)}` };
	if (event.url.searchParams.get('detail') === 'summary') {
		const { units: _units, inputs: _inputs, ...summary } = evaluation;
		return json({ ...summary, unit_count: evaluation.units.length }, { headers });
	}
	return json(evaluation, { headers });
});
