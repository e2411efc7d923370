/**
 * The name a stored file is shown and downloaded under. Bytes live in PostgreSQL and never touch a
 * file system, but the name still travels into Content-Disposition headers, pages, e-mails and
 * the downloader's disk, so it is reduced to one plain segment with the extension of its real type.
 */
import { FILE_TYPES, type FileType } from './file-types';

export const MAX_FILE_NAME_LENGTH = 120;

// C0 and C1 controls, DEL, zero-width and bidirectional controls (which can disguise "txt.exe"), BOM.
// eslint-disable-next-line no-control-regex -- finding control characters is what this pattern is for
const INVISIBLE = /[\u0000-\u001f\u007f-\u009f\u200b-\u200f\u202a-\u202e\u2066-\u2069\ufeff]/g;
// Reserved in Windows names, or special in a header parameter.
const RESERVED = /[<>:"|?*;\\]/g;

/** The part after the last "/" or "\", so "../../x.pdf" and "C:\\tmp\\x.pdf" become "x.pdf". */
const lastSegment = (name: string) => name.split(/[\\/]/).pop() ?? '';

/** The lower-case extension of a name ("" when there is none). */
export function extensionOf(name: string): string {
	const match = /\.([A-Za-z0-9]{1,10})$/.exec(lastSegment(name).trim());
	return match ? match[1].toLowerCase() : '';
}

/** Cut to a number of code points without splitting a surrogate pair. */
const cut = (text: string, max: number) => Array.from(text).slice(0, max).join('');

const tidy = (text: string) =>
	text
		.replace(/\s+/g, ' ')
		.replace(/\.{2,}/g, '.') // no ".." anywhere
		.replace(/^[\s.]+|[\s.]+$/g, ''); // no hidden ".name", no trailing dot or space

/**
 * One safe segment: no folders, no control or invisible characters, no "..", at most
 * MAX_FILE_NAME_LENGTH characters, ending in an extension of the file's real type (kept when it
 * already is one, e.g. ".jpeg"; added otherwise). An empty result becomes `<fallback>.<ext>`.
 */
export function cleanFileName(raw: string, type: FileType, fallback = 'file'): string {
	const name = tidy(lastSegment(raw.normalize('NFC')).replace(INVISIBLE, '').replace(RESERVED, '_'));
	const own = extensionOf(name);
	const extensions: readonly string[] = FILE_TYPES[type].extensions;
	const ext = extensions.includes(own) ? own : extensions[0];
	const stem = extensions.includes(own) ? name.slice(0, -(own.length + 1)) : name;
	const shortStem = tidy(cut(stem, MAX_FILE_NAME_LENGTH - ext.length - 1));
	return `${shortStem || fallback}.${ext}`;
}
