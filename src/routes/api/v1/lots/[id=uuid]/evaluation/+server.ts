import { json } from '@sveltejs/kit';
import { getDb } from '$lib/server/db';
import { api, authorize, jsonBytes, notFound } from '$lib/server/http';
import { computeAndCache, etagMatches, evaluationEtag, lotRevision, tokenUserAndLotRevision, type LotRevision } from '$lib/server/services/evaluation-cache';
import type { RequestEvent, RequestHandler } from './$types';

/** Sets `locals.user` when the bearer token is live; the lot (or null) read in the same statement. */
async function withTokenUser(event: RequestEvent): Promise<LotRevision | null> {
	const found = await tokenUserAndLotRevision(event.locals.bearerToken!, event.params.id);
	if (!found) return null;
	event.locals.user = found.user;
	event.locals.authMethod = 'token';
	return found.lot;
}

/**
 * GET /api/v1/lots/{id}/evaluation — the disposition computed from the stored readings, served
 * from the revision-keyed cache while nothing that feeds it changed. ETag = the lot's revision;
 * `If-None-Match` → 304. The body is services/evaluation-body.ts's served form (no readings snapshot,
 * unit numbers to 1e-6); `?detail=summary` also leaves out the per-unit results and the inputs.
 */
export const GET: RequestHandler = api(async (event) => {
	// A bearer token is checked here, in the same statement as the lot read (auth.ts lists this route).
	const readWithToken = event.locals.bearerToken ? await withTokenUser(event) : undefined;
	const user = authorize(event, 'lot:read', event.locals.user?.role === 'supplier' ? { supplierId: event.locals.user.organisationId } : undefined);
	const db = getDb();
	const found = readWithToken === undefined ? await lotRevision(event.params.id) : readWithToken;
	// Another supplier's lot is simply not there (404, not 403).
	if (!found || (user.role === 'supplier' && found.supplierId !== user.organisationId)) throw notFound('lot');
	authorize(event, 'lot:read', { supplierId: found.supplierId });
	const summary = event.url.searchParams.get('detail') === 'summary';
	const etag = evaluationEtag(found.revision, summary ? 'summary' : 'full');
	if (etagMatches(event.request.headers.get('if-none-match'), etag)) return new Response(null, { status: 304, headers: { etag } });

	const started = performance.now();
	const body = found.body ?? (await computeAndCache(db, found));
	const headers = { etag, 'server-timing': `evaluate;dur=${(performance.now() - started).toFixed(1)};desc="${found.body ? 'cached' : 'computed'}"` };
	if (summary) {
		const { units, inputs: _inputs, ...rest } = JSON.parse(body) as { units: unknown[]; inputs: unknown };
		return json({ ...rest, unit_count: units.length }, { headers });
	}
	// The body is ASCII-only (servedJson), so Latin-1 gives its UTF-8 bytes with a plain copy.
	return jsonBytes(Buffer.from(body, 'latin1'), headers);
});
