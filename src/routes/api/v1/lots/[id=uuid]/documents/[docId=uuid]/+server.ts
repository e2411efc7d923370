import { api, authorize, notFound } from '$lib/server/http';
import { ownOrganisation } from '$lib/server/policy';
import { getDb } from '$lib/server/db';
import { getLotForUser } from '$lib/server/services/lots';
import { downloadHeaders, getDocumentFile } from '$lib/server/services/documents';
import type { RequestHandler } from './$types';

/** GET /api/v1/lots/{id}/documents/{docId} — the file, always as an attachment with its sniffed type. */
export const GET: RequestHandler = api(async (event) => {
	const user = event.locals.user;
	authorize(event, 'document:read', ownOrganisation(user));
	const db = getDb();
	const lot = await getLotForUser(db, user!, event.params.id);
	if (!lot) throw notFound('lot');
	authorize(event, 'document:read', { supplierId: lot.supplierId }); // the lot's own supplier, as the other lot routes check
	const doc = await getDocumentFile(db, lot.id, event.params.docId);
	if (!doc) throw notFound('document');
	return new Response(new Uint8Array(doc.bytes), { headers: downloadHeaders(doc) });
});
