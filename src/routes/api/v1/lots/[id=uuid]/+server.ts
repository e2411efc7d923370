import { json } from '@sveltejs/kit';
import { api, authorize, notFound } from '$lib/server/http';
import { ownOrganisation } from '$lib/server/policy';
import { getDb } from '$lib/server/db';
import { getLotForUser, lotJson } from '$lib/server/services/lots';
import { listDocuments, documentJson, missingDocuments } from '$lib/server/services/documents';
import { getPart } from '$lib/server/services/parts';
import type { RequestHandler } from './$types';

/** GET /api/v1/lots/{id} — the lot with its documents; another supplier's lot is 404. */
export const GET: RequestHandler = api(async (event) => {
	const user = authorize(event, 'lot:read', ownOrganisation(event.locals.user));
	const db = getDb();
	const lot = await getLotForUser(db, user, event.params.id);
	if (!lot) throw notFound('lot');
	authorize(event, 'lot:read', { supplierId: lot.supplierId });
	const docs = await listDocuments(db, lot.id);
	const part = await getPart(db, lot.partId);
	return json({
		...lotJson(lot),
		documents: docs.map(documentJson),
		missing_documents: missingDocuments(part?.requiredDocuments ?? [], docs)
	});
});
