/**
 * Lot documents: sniffed by content (never trusted by name or declared type), size-limited,
 * fingerprinted with SHA-256 so the same file twice on a lot is recognised. Bytes live in PG.
 */
import { createHash } from 'node:crypto';
import { and, asc, eq } from 'drizzle-orm';
import type { Database } from '../db';
import { documents } from '../db/schema';
import type { SessionUser } from '$lib/roles';
import { MAX_DOCUMENT_BYTES, type AcceptedMime, type UploadKind } from '$lib/schemas/document';
import { recordAudit } from './audit';

/** Why an upload was refused, with the HTTP status that says it best. */
export class DocumentRejected extends Error {
	constructor(
		readonly status: 400 | 409 | 413 | 415,
		readonly code: string,
		message: string,
		readonly existing?: { id: string; fileName: string }
	) {
		super(message);
	}
}

const EXTENSION: Record<AcceptedMime, string> = { 'application/pdf': 'pdf', 'image/png': 'png', 'image/jpeg': 'jpg' };
const MIME_OF_EXTENSION: Record<string, AcceptedMime> = {
	pdf: 'application/pdf',
	png: 'image/png',
	jpg: 'image/jpeg',
	jpeg: 'image/jpeg'
};

/** The file's real type from its first bytes (PDF, PNG or JPEG), or null. */
export function sniffMime(bytes: Uint8Array): AcceptedMime | null {
	const starts = (sig: number[]) => sig.every((b, i) => bytes[i] === b);
	if (starts([0x25, 0x50, 0x44, 0x46, 0x2d])) return 'application/pdf'; // "%PDF-"
	if (starts([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])) return 'image/png';
	if (starts([0xff, 0xd8, 0xff])) return 'image/jpeg';
	return null;
}

/** A display name without folders or control characters; the bytes never touch the file system. */
export function cleanFileName(name: string, mime: AcceptedMime): string {
	const base = (name.split(/[\\/]/).pop() ?? '').replace(/[\u0000-\u001f\u007f"]/g, '').trim().slice(0, 150);
	return base || `document.${EXTENSION[mime]}`;
}

function extensionOf(name: string): string | null {
	const match = /\.([a-z0-9]{1,8})$/i.exec(name);
	return match ? match[1].toLowerCase() : null;
}

/** Refuse what cannot be stored, in the order a person would want to hear it. */
export function checkUpload(fileName: string, bytes: Uint8Array): AcceptedMime {
	if (bytes.byteLength === 0) throw new DocumentRejected(400, 'empty_file', 'The file is empty');
	if (bytes.byteLength > MAX_DOCUMENT_BYTES) {
		throw new DocumentRejected(413, 'file_too_large', `The file is ${mb(bytes.byteLength)}; the limit is ${mb(MAX_DOCUMENT_BYTES)}`);
	}
	const mime = sniffMime(bytes);
	const ext = extensionOf(fileName);
	const claimed = ext ? MIME_OF_EXTENSION[ext] : undefined;
	if (!mime) {
		const why = claimed && ext ? `is named .${ext} but its content is not a ${ext.toUpperCase()} file` : 'is not a PDF, PNG or JPEG file';
		throw new DocumentRejected(415, 'unsupported_type', `“${fileName}” ${why}. Upload a PDF, PNG or JPEG.`);
	}
	if (claimed && claimed !== mime) {
		throw new DocumentRejected(415, 'type_mismatch', `“${fileName}” is named .${ext} but its content is ${EXTENSION[mime].toUpperCase()}. Rename it or upload the right file.`);
	}
	return mime;
}

const mb = (bytes: number) => `${(bytes / (1024 * 1024)).toFixed(1)} MB`;

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

const metaColumns = {
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

async function findBySha(db: Database, lotId: string, sha256: string) {
	const [row] = await db
		.select({ id: documents.id, fileName: documents.fileName })
		.from(documents)
		.where(and(eq(documents.lotId, lotId), eq(documents.sha256, sha256)));
	return row ?? null;
}

const duplicate = (existing: { id: string; fileName: string }) =>
	new DocumentRejected(409, 'duplicate_document', `This file is already attached as “${existing.fileName}”`, existing);

/**
 * Store a document on a lot (the caller has checked the lot is visible and uploadable).
 * A concurrent upload of the same bytes loses on the unique index and is reported as a duplicate.
 */
export async function uploadDocument(
	db: Database,
	actor: SessionUser,
	lotId: string,
	upload: { kind: UploadKind | 'corrective_action'; fileName: string; bytes: Uint8Array }
): Promise<DocumentMeta> {
	const mime = checkUpload(upload.fileName, upload.bytes);
	const sha256 = createHash('sha256').update(upload.bytes).digest('hex');
	const existing = await findBySha(db, lotId, sha256);
	if (existing) throw duplicate(existing);
	try {
		return await db.transaction(async (tx) => {
			const [row] = await tx
				.insert(documents)
				.values({
					lotId,
					kind: upload.kind,
					fileName: cleanFileName(upload.fileName, mime),
					mime,
					sizeBytes: upload.bytes.byteLength,
					sha256,
					bytes: Buffer.from(upload.bytes),
					uploadedBy: actor.id
				})
				.returning(metaColumns);
			await recordAudit(tx, {
				actorId: actor.id,
				actorEmail: actor.email,
				action: 'document.upload',
				entityType: 'document',
				entityId: row.id,
				lotId,
				details: { kind: row.kind, fileName: row.fileName, mime, sizeBytes: row.sizeBytes, sha256 }
			});
			return row;
		});
	} catch (error) {
		const raced = isUniqueViolation(error) ? await findBySha(db, lotId, sha256) : null;
		if (raced) throw duplicate(raced);
		throw error;
	}
}

function isUniqueViolation(error: unknown): boolean {
	const e = error as { code?: string; cause?: { code?: string } };
	return e?.code === '23505' || e?.cause?.code === '23505';
}

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

/** Headers for a download: always an attachment, the sniffed type, and a name that cannot break out. */
export function downloadHeaders(doc: { fileName: string; mime: string; sizeBytes: number }): Record<string, string> {
	const ascii = doc.fileName.replace(/[^\x20-\x7e]/g, '_').replace(/["\\;]/g, '_');
	return {
		'Content-Type': doc.mime,
		'Content-Length': String(doc.sizeBytes),
		'Content-Disposition': `attachment; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(doc.fileName)}`,
		'X-Content-Type-Options': 'nosniff',
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
