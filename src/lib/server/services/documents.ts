/**
 * Lot documents, the reading side: listing, one file with its bytes, and the headers it is served
 * with. Files come in through services/uploads.ts only (sniffed, size-limited, cleaned names,
 * immutable rows, audited). Bytes live in PG.
 */
import { and, asc, eq } from 'drizzle-orm';
import type { Database } from '../db';
import { documents } from '../db/schema';
import { FILE_TYPES } from '$lib/uploads/file-types';

export interface DocumentMeta {
	id: string;
	lotId: string;
	kind: string;
	fileName: string;
	mime: string;
	sizeBytes: number;
	sha256: string;
	uploadedAt: Date;
	uploadedBy: string | null;
}

export const metaColumns = {
	id: documents.id,
	lotId: documents.lotId,
	kind: documents.kind,
	fileName: documents.fileName,
	mime: documents.mime,
	sizeBytes: documents.sizeBytes,
	sha256: documents.sha256,
	uploadedAt: documents.uploadedAt,
	uploadedBy: documents.uploadedBy
};

export async function listDocuments(db: Database, lotId: string): Promise<DocumentMeta[]> {
	return db.select(metaColumns).from(documents).where(eq(documents.lotId, lotId)).orderBy(asc(documents.uploadedAt));
}

/** One document with its bytes, only if it belongs to this lot. */
export async function getDocumentFile(db: Database, lotId: string, docId: string) {
	const [row] = await db
		.select({ ...metaColumns, bytes: documents.bytes })
		.from(documents)
		.where(and(eq(documents.id, docId), eq(documents.lotId, lotId)));
	return row ?? null;
}

/** The types a stored file may be served as; anything else (a row from before uploads.ts) is plain bytes. */
const SERVABLE = new Set<string>(Object.values(FILE_TYPES).map((t) => t.mime));

/**
 * Headers for a download: always an attachment, a type from the allow-list, no sniffing, no
 * script (CSP sandbox), and a name that cannot break out of the header or name a folder.
 */
export function downloadHeaders(doc: { fileName: string; mime: string; sizeBytes: number }): Record<string, string> {
	// eslint-disable-next-line no-control-regex -- finding control characters is what this pattern is for
	const name = (doc.fileName.split(/[\\/]/).pop() || 'file').replace(/[\u0000-\u001f\u007f]/g, '');
	const ascii = name.replace(/[^\x20-\x7e]/g, '_').replace(/["\\;]/g, '_');
	return {
		'Content-Type': SERVABLE.has(doc.mime) ? doc.mime : 'application/octet-stream',
		'Content-Length': String(doc.sizeBytes),
		'Content-Disposition': `attachment; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(name)}`,
		'X-Content-Type-Options': 'nosniff',
		'Content-Security-Policy': "default-src 'none'; frame-ancestors 'none'; sandbox",
		'Cache-Control': 'private, no-store'
	};
}

/** Required document kinds the lot does not have yet. */
export function missingDocuments(required: readonly string[], present: readonly { kind: string }[]): string[] {
	const have = new Set(present.map((d) => d.kind));
	return required.filter((k) => !have.has(k));
}

/** snake_case JSON for the API. */
export function documentJson(d: DocumentMeta) {
	return {
		id: d.id,
		lot_id: d.lotId,
		kind: d.kind,
		file_name: d.fileName,
		mime: d.mime,
		size_bytes: d.sizeBytes,
		sha256: d.sha256,
		uploaded_at: d.uploadedAt.toISOString()
	};
}
