/** Lot documents: what may be uploaded and how big. */
import { z } from 'zod';

export const UPLOAD_KINDS = ['coc', 'un38_3_summary', 'sds', 'other'] as const;
export type UploadKind = (typeof UPLOAD_KINDS)[number];
export const MAX_DOCUMENT_BYTES = 20 * 1024 * 1024;

export const documentKindSchema = z.enum(UPLOAD_KINDS, {
	error: 'kind is one of coc, un38_3_summary, sds, other'
});

/** The non-file part of an upload (multipart `kind`). */
export const documentUploadSchema = z.object({ kind: documentKindSchema });
