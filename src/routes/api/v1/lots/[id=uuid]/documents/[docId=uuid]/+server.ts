import { api, notFound } from '$lib/server/http';
import { visibleLot } from '$lib/server/route-helpers';
import { getDb } from '$lib/server/db';
import { downloadHeaders, getDocumentFile } from '$lib/server/services/documents';
import type { RequestHandler } from './$types';

/** GET /api/v1/lots/{id}/documents/{docId} — the file, always as an attachment with its sniffed type. */
export const GET: RequestHandler = api(async (event) => {
	const { lot } = await visibleLot(event, event.params.id, 'document:read');
	const doc = await getDocumentFile(getDb(), lot.id, event.params.docId);
	if (!doc) throw notFound('document');
	return new Response(new Uint8Array(doc.bytes), { headers: downloadHeaders(doc) });
});
