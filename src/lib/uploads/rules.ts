/**
 * One rule book for every file that comes in: per use, the types allowed and the size limit; then
 * the checks in the order a person wants to hear them (empty, too large, not an allowed type, the
 * name or the declared type says otherwise). Pure, so the unit tests and the server agree.
 */
import { megabytes } from '$lib/format';
import { MAX_DOCUMENT_BYTES } from '$lib/schemas/document';
import { MAX_IMPORT_BYTES } from '$lib/schemas/readings';
import { cleanFileName, extensionOf } from './file-name';
import { FILE_TYPES, FOREIGN_EXTENSIONS, GENERIC_DECLARED, typeList, typeOfExtension, type FileType } from './file-types';
import { sniff, type Sniffed } from './sniff';

export const MAX_REPLY_BYTES = 20 * 1024 * 1024;

export const UPLOAD_USES = {
	/** CoC, UN 38.3 summary, SDS and other papers the buyer attaches to a lot. */
	lot_document: { types: ['pdf', 'png', 'jpeg'], maxBytes: MAX_DOCUMENT_BYTES, fallbackName: 'document' },
	/** A supplier's corrective-action report or evidence beside a reply to a notice. */
	supplier_reply: { types: ['pdf', 'png', 'jpeg', 'xlsx', 'csv', 'txt'], maxBytes: MAX_REPLY_BYTES, fallbackName: 'reply' },
	/** A meter's export read into readings (not stored as a file). */
	meter_file: { types: ['csv', 'xlsx'], maxBytes: MAX_IMPORT_BYTES, fallbackName: 'meter-file' }
} as const satisfies Record<string, { types: readonly FileType[]; maxBytes: number; fallbackName: string }>;

export type UploadUse = keyof typeof UPLOAD_USES;

export interface IncomingFile {
	/** The name the client sent (untrusted). */
	name: string;
	/** The MIME type the client declared (untrusted; may be empty). */
	declaredType: string;
	bytes: Uint8Array;
}

export interface AcceptedFile {
	type: FileType;
	/** The MIME type it is stored and served as. */
	mime: string;
	/** The cleaned display name. */
	fileName: string;
	bytes: Uint8Array;
}

export interface UploadRefusal {
	status: 400 | 413 | 415;
	code: 'empty_file' | 'file_too_large' | 'unsupported_type' | 'type_mismatch';
	message: string;
}

export type UploadVerdict = { ok: true; file: AcceptedFile } | { ok: false; refusal: UploadRefusal };

const SNIFFED_WORDS: Record<Sniffed, string> = {
	pdf: 'a PDF file',
	png: 'a PNG image',
	jpeg: 'a JPEG image',
	xlsx: 'an XLSX workbook',
	text: 'a text file',
	html: 'an HTML page',
	xml: 'an XML or SVG document',
	zip: 'a ZIP archive (for example a Word document), not an XLSX workbook',
	binary: 'a binary file of a kind not listed here',
	empty: 'empty'
};

/** The display form of the client's name for messages: its last segment, printable, short. */
const shown = (name: string) => {
	// eslint-disable-next-line no-control-regex -- finding control characters is what this pattern is for
	const segment = (name.split(/[\\/]/).pop() ?? '').replace(/[\u0000-\u001f\u007f-\u009f]/g, '').trim();
	return Array.from(segment || 'the file')
		.slice(0, 80)
		.join('');
};

/** What the bytes are, among the types this use allows; text becomes CSV or plain text by name. */
function typeOfContent(sniffed: Sniffed, ext: string, allowed: readonly FileType[]): FileType | null {
	if (sniffed !== 'text') return (allowed as readonly string[]).includes(sniffed) ? (sniffed as FileType) : null;
	const byName = typeOfExtension(
		ext,
		allowed.filter((t) => t === 'csv' || t === 'txt')
	);
	if (byName) return byName;
	return allowed.includes('txt') ? 'txt' : allowed.includes('csv') ? 'csv' : null;
}

const refuse = (status: UploadRefusal['status'], code: UploadRefusal['code'], message: string): UploadVerdict => ({
	ok: false,
	refusal: { status, code, message }
});

export function checkUpload(use: UploadUse, file: IncomingFile): UploadVerdict {
	const rule = UPLOAD_USES[use];
	const name = shown(file.name);
	if (file.bytes.byteLength === 0) return refuse(400, 'empty_file', `“${name}” is empty.`);
	if (file.bytes.byteLength > rule.maxBytes) {
		return refuse(413, 'file_too_large', `“${name}” is ${megabytes(file.bytes.byteLength)}; the limit is ${megabytes(rule.maxBytes)}.`);
	}
	const sniffed = sniff(file.bytes);
	const ext = extensionOf(file.name);
	const type = typeOfContent(sniffed, ext, rule.types);
	const wanted = `Upload a ${typeList(rule.types)} file.`;
	const nameType = typeOfExtension(ext, Object.keys(FILE_TYPES) as FileType[]);
	const textBoth = sniffed === 'text' && (nameType === 'csv' || nameType === 'txt');
	if (!type) {
		const claim = nameType && nameType !== sniffed && !textBoth ? `is named .${ext} but ` : '';
		return refuse(415, 'unsupported_type', `“${name}” ${claim}is ${SNIFFED_WORDS[sniffed]}, which is not accepted here. ${wanted}`);
	}
	const label = FILE_TYPES[type].label;
	if ((nameType && nameType !== type && !textBoth) || FOREIGN_EXTENSIONS.includes(ext)) {
		return refuse(415, 'type_mismatch', `“${name}” is named .${ext} but its content is ${label}. Rename it or upload the right file.`);
	}
	const declared = file.declaredType.split(';')[0].trim().toLowerCase();
	if (!GENERIC_DECLARED.includes(declared) && !(FILE_TYPES[type].declared as readonly string[]).includes(declared)) {
		return refuse(415, 'type_mismatch', `“${name}” was sent as ${declared.slice(0, 80)} but its content is ${label}. ${wanted}`);
	}
	return {
		ok: true,
		file: { type, mime: FILE_TYPES[type].mime, fileName: cleanFileName(file.name, type, rule.fallbackName), bytes: file.bytes }
	};
}
