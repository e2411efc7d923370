import { json, type RequestEvent } from '@sveltejs/kit';
import { statusOf } from '$lib/server/error-status';
import { api, authorize, badRequest, conflict, notFound, parseWith, unprocessable } from '$lib/server/http';
import { visibleLot } from '$lib/server/route-helpers';
import { getDb } from '$lib/server/db';
import { megabytes } from '$lib/format';
import { getLotForUser } from '$lib/server/services/lots';
import { documentJson, listDocuments } from '$lib/server/services/documents';
import { DuplicateDocument, UploadRefused, uploadDocument } from '$lib/server/services/uploads';
import { documentUploadSchema, MAX_DOCUMENT_BYTES } from '$lib/schemas/document';
import type { RequestHandler } from './$types';

// Multipart framing around the file is small; anything much larger than the limit is refused unread.
const MULTIPART_OVERHEAD = 64 * 1024;

/** The lot whose documents are read: 404 for another supplier's. */
const documentsLot = (event: RequestEvent<{ id: string }>) => visibleLot(event, event.params.id, 'document:read');

/** GET /api/v1/lots/{id}/documents — the lot's documents (metadata only). */
export const GET: RequestHandler = api(async (event) => {
	const { lot } = await documentsLot(event);
	const docs = await listDocuments(getDb(), lot.id);
	return json({ documents: docs.map(documentJson) });
});

async function readUpload(request: Request): Promise<{ kind: unknown; file: File }> {
	const length = Number(request.headers.get('content-length') ?? 0);
	if (length > MAX_DOCUMENT_BYTES + MULTIPART_OVERHEAD) {
		throw new UploadRefused(
			'too_large',
			'file_too_large',
			`The upload is ${megabytes(length)}; the limit is ${megabytes(MAX_DOCUMENT_BYTES, 0)} per file`
		);
	}
	let form: FormData;
	try {
		form = await request.formData();
	} catch {
		throw badRequest('Send the document as multipart/form-data with the fields kind and file');
	}
	const file = form.get('file');
	if (!(file instanceof File)) {
		throw unprocessable('The upload has no file', [{ path: 'file', message: 'Attach the document as the field "file"' }]);
	}
	return { kind: form.get('kind'), file };
}

/**
 * POST /api/v1/lots/{id}/documents — multipart `kind` + `file` (PDF, PNG or JPEG, ≤ 20 MB; see
 * services/uploads.ts) → 201 metadata; the same bytes twice → 409; a refused file → 400/413/415
 * with an issue naming `file`.
 */
export const POST: RequestHandler = api(async (event) => {
	const user = authorize(event, 'document:upload');
	const lot = await getLotForUser(getDb(), user, event.params.id);
	if (!lot) throw notFound('lot');
	if (lot.status === 'cancelled') throw conflict('The lot is cancelled; documents can no longer be added');
	const { kind, file } = await readUpload(event.request);
	const { kind: validKind } = parseWith(documentUploadSchema, { kind }, 'The upload');
	try {
		const bytes = new Uint8Array(await file.arrayBuffer());
		const doc = await uploadDocument(getDb(), user, lot.id, { kind: validKind, fileName: file.name, declaredType: file.type, bytes });
		return json(documentJson(doc), { status: 201, headers: { Location: `/api/v1/lots/${lot.id}/documents/${doc.id}` } });
	} catch (error) {
		if (!(error instanceof DuplicateDocument)) throw error; // other refusals answer through api()
		const body = {
			error: {
				code: error.code,
				message: error.message,
				issues: error.issues,
				existing_document_id: error.existing.id,
				existing_file_name: error.existing.fileName
			}
		};
		return json(body, { status: statusOf(error.kind) });
	}
});
