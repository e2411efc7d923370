import { json } from '@sveltejs/kit';
import { api } from '$lib/server/http';
import { visibleLot } from '$lib/server/route-helpers';
import { getDb } from '$lib/server/db';
import { lotJson } from '$lib/server/services/lots';
import { listDocuments, documentJson, missingDocuments } from '$lib/server/services/documents';
import { getPart } from '$lib/server/services/parts';
import type { RequestHandler } from './$types';

/** GET /api/v1/lots/{id} — the lot with its documents; another supplier's lot is 404. */
export const GET: RequestHandler = api(async (event) => {
	const { lot } = await visibleLot(event, event.params.id, 'lot:read');
	const db = getDb();
	const docs = await listDocuments(db, lot.id);
	const part = await getPart(db, lot.partId);
	return json({
		...lotJson(lot),
		documents: docs.map(documentJson),
		missing_documents: missingDocuments(part?.requiredDocuments ?? [], docs)
	});
});
