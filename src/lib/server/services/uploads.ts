/**
 * The one path every incoming file takes (lot documents, supplier reply attachments, meter files):
 * the rule book in $lib/uploads (size, content sniffing, allow-list per use, declared type, cleaned
 * name), then, for files that are kept, one new immutable `documents` row with its audit entry.
 * A stored document is never changed afterwards (a trigger refuses it, drizzle/0007): the same
 * bytes again on the lot are either refused as a duplicate or answered with the existing row.
 */
import { createHash } from 'node:crypto';
import { and, eq } from 'drizzle-orm';
import type { SessionUser } from '$lib/roles';
import type { UploadKind } from '$lib/schemas/document';
import { checkUpload, type AcceptedFile, type IncomingFile, type UploadUse } from '$lib/uploads/rules';
import type { Database, Tx } from '../db';
import { documents } from '../db/schema';
import { DomainError, type ErrorKind } from '../errors';
import { recordAudit } from './audit';
import { metaColumns, type DocumentMeta } from './documents';

/** A refused file: the kind that says it best, and an issue naming the form field. */
export class UploadRefused extends DomainError {
	constructor(kind: ErrorKind, code: string, message: string, field = 'file') {
		super(kind, code, message, [{ path: field, message }]);
	}
}

/** The rule book's refusals (written as statuses, $lib/uploads/rules) in the domain's words. */
const REFUSAL_KIND = { 400: 'malformed', 413: 'too_large', 415: 'unsupported_type' } as const satisfies Record<number, ErrorKind>;

/** The same bytes are already attached to the lot (lot documents refuse a second copy). */
export class DuplicateDocument extends UploadRefused {
	constructor(readonly existing: { id: string; fileName: string }) {
		super('conflict', 'duplicate_document', `This file is already attached as “${existing.fileName}”`);
	}
}

/** A multipart field as an incoming file, or null when the field holds no file (or an empty one). */
export async function incomingFile(value: FormDataEntryValue | null): Promise<IncomingFile | null> {
	if (!(value instanceof File) || value.size === 0) return null;
	return { name: value.name, declaredType: value.type, bytes: new Uint8Array(await value.arrayBuffer()) };
}

/** Check a file against the rules of its use; throws UploadRefused (naming `field`). */
export function acceptUpload(use: UploadUse, file: IncomingFile, field = 'file'): AcceptedFile {
	const verdict = checkUpload(use, file);
	if (!verdict.ok) throw new UploadRefused(REFUSAL_KIND[verdict.refusal.status], verdict.refusal.code, verdict.refusal.message, field);
	return verdict.file;
}

export const sha256Hex = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');

type DocumentKind = UploadKind | 'corrective_action';

export interface StoredFile {
	document: DocumentMeta;
	/** True when the lot already held these exact bytes and that row was answered instead. */
	existing: boolean;
}

async function findBySha(db: Database | Tx, lotId: string, sha256: string): Promise<DocumentMeta | null> {
	const [row] = await db
		.select(metaColumns)
		.from(documents)
		.where(and(eq(documents.lotId, lotId), eq(documents.sha256, sha256)));
	return row ?? null;
}

/**
 * Insert an accepted file as a new document of the lot, with an audit entry, inside the caller's
 * transaction. Bytes already on the lot are never overwritten or renamed: ON CONFLICT DO NOTHING,
 * then the existing row is returned with `existing: true` (the caller decides whether that is an
 * error). A concurrent upload of the same bytes waits on the unique index and ends the same way.
 */
export async function storeLotFile(
	tx: Tx,
	actor: SessionUser,
	lotId: string,
	kind: DocumentKind,
	file: AcceptedFile,
	use: UploadUse
): Promise<StoredFile> {
	const sha256 = sha256Hex(file.bytes);
	const [row] = await tx
		.insert(documents)
		.values({
			lotId,
			kind,
			fileName: file.fileName,
			mime: file.mime,
			sizeBytes: file.bytes.byteLength,
			sha256,
			bytes: Buffer.from(file.bytes),
			uploadedBy: actor.id
		})
		.onConflictDoNothing({ target: [documents.lotId, documents.sha256] })
		.returning(metaColumns);
	if (!row) {
		const existing = await findBySha(tx, lotId, sha256);
		if (!existing) throw new Error(`document ${sha256} of lot ${lotId} conflicted but cannot be found`);
		return { document: existing, existing: true };
	}
	await recordAudit(tx, {
		actorId: actor.id,
		actorEmail: actor.email,
		action: 'document.upload',
		entityType: 'document',
		entityId: row.id,
		lotId,
		details: { use, kind, fileName: row.fileName, mime: row.mime, sizeBytes: row.sizeBytes, sha256 }
	});
	return { document: row, existing: false };
}

/**
 * A buyer attaches a document to a lot (the caller has checked the lot is visible and open for
 * documents). The same bytes twice on one lot → 409 duplicate_document naming the first copy.
 */
export async function uploadDocument(
	db: Database,
	actor: SessionUser,
	lotId: string,
	upload: { kind: UploadKind; fileName: string; bytes: Uint8Array; declaredType?: string }
): Promise<DocumentMeta> {
	const file = acceptUpload('lot_document', { name: upload.fileName, declaredType: upload.declaredType ?? '', bytes: upload.bytes });
	const stored = await db.transaction((tx) => storeLotFile(tx, actor, lotId, upload.kind, file, 'lot_document'));
	if (stored.existing) throw new DuplicateDocument(stored.document);
	return stored.document;
}
