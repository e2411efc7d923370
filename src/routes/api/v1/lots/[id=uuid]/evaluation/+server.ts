import { json } from '@sveltejs/kit';
import { getDb } from '$lib/server/db';
import { api, authorize, notFound } from '$lib/server/http';
import { ownOrganisation } from '$lib/server/policy';
import { computeAndCache, etagMatches, evaluationEtag, lotRevision } from '$lib/server/services/evaluation-cache';
import type { RequestHandler } from './$types';

/**
 * GET /api/v1/lots/{id}/evaluation — the disposition computed from the stored readings, served
 * from the revision-keyed cache while nothing that feeds it changed. ETag = the lot's revision;
 * `If-None-Match` → 304. The body is services/evaluation-body.ts's served form (no readings snapshot,
 * unit numbers to 1e-6); `?detail=summary` also leaves out the per-unit results and the inputs.
 */
export const GET: RequestHandler = api(async (event) => {
	const user = authorize(event, 'lot:read', ownOrganisation(event.locals.user));
	const db = getDb();
	const found = await lotRevision(db, event.params.id);
	// Another supplier's lot is simply not there (404, not 403).
	if (!found || (user.role === 'supplier' && found.supplierId !== user.organisationId)) throw notFound('lot');
	authorize(event, 'lot:read', { supplierId: found.supplierId });
	const summary = event.url.searchParams.get('detail') === 'summary';
	const etag = evaluationEtag(found.revision, summary ? 'summary' : 'full');
	if (etagMatches(event.request.headers.get('if-none-match'), etag)) return new Response(null, { status: 304, headers: { etag } });

	const started = performance.now();
	const body = found.body ?? (await computeAndCache(db, found));
	const headers = {
		etag,
		'server-timing': `evaluate;dur=${(performance.now() - started).toFixed(1)};desc="${found.body ? 'cached' : 'computed'}"`
	};
	if (summary) {
		const { units, inputs: _inputs, ...rest } = JSON.parse(body) as { units: unknown[]; inputs: unknown };
		return json({ ...rest, unit_count: units.length }, { headers });
	}
	// The cached text is already the JSON answer.
	return new Response(body, { headers: { ...headers, 'content-type': 'application/json' } });
});
