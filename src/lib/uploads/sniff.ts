/**
 * What a file really is, from its bytes: never from its name or the type the client declared.
 * Signatures: PDF "%PDF-" (ISO 32000-1, 7.5.2), PNG's 8-byte signature (PNG spec, 5.2), JPEG's
 * SOI marker FF D8 followed by a marker FF (ITU-T T.81, B.1), ZIP local header "PK\3\4" (PKWARE
 * APPNOTE 4.3.7), and an XLSX workbook is a ZIP holding [Content_Types].xml and xl/workbook.xml
 * (ECMA-376 Part 2). Markup is recognised by the leading tags of the WHATWG MIME Sniffing
 * standard's "rules for identifying an unknown MIME type", so HTML is never taken for text.
 */
export type Sniffed = 'pdf' | 'png' | 'jpeg' | 'xlsx' | 'text' | 'html' | 'xml' | 'zip' | 'binary' | 'empty';

const startsWith = (bytes: Uint8Array, signature: readonly number[], at = 0) => signature.every((b, i) => bytes[at + i] === b);
const ascii = (text: string) => [...text].map((c) => c.charCodeAt(0));

const PDF = ascii('%PDF-');
const PNG = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];
const JPEG = [0xff, 0xd8, 0xff];
const ZIP = [0x50, 0x4b, 0x03, 0x04];
const UTF8_BOM = [0xef, 0xbb, 0xbf];

/** Whether the ASCII text occurs anywhere in the bytes (entry names in a ZIP are stored as is). */
export function containsAscii(bytes: Uint8Array, text: string): boolean {
	const needle = ascii(text);
	for (let i = bytes.indexOf(needle[0]); i >= 0 && i <= bytes.length - needle.length; i = bytes.indexOf(needle[0], i + 1)) {
		if (startsWith(bytes, needle, i)) return true;
	}
	return false;
}

// WHATWG MIME Sniffing, 7.1: each tag is followed by a space or ">" (a "tag-terminating byte").
const HTML_TAGS = [
	'!DOCTYPE HTML',
	'HTML',
	'HEAD',
	'SCRIPT',
	'IFRAME',
	'H1',
	'DIV',
	'FONT',
	'TABLE',
	'A',
	'STYLE',
	'TITLE',
	'B',
	'BODY',
	'BR',
	'P'
];
const WHITESPACE = new Set([0x09, 0x0a, 0x0c, 0x0d, 0x20]);

/** "html" or "xml" when the text opens with markup (after a BOM and white space), else null. */
export function sniffMarkup(bytes: Uint8Array): 'html' | 'xml' | null {
	let i = startsWith(bytes, UTF8_BOM) ? 3 : 0;
	while (i < bytes.length && WHITESPACE.has(bytes[i])) i++;
	if (bytes[i] !== 0x3c) return null; // "<"
	const head = String.fromCharCode(...bytes.subarray(i + 1, i + 16)).toUpperCase();
	if (head.startsWith('!--')) return 'html';
	if (head.startsWith('?XML')) return 'xml';
	if (/^SVG[\s>/]/.test(head)) return 'xml';
	for (const tag of HTML_TAGS) {
		if (head.startsWith(tag) && (head.length === tag.length || head[tag.length] === ' ' || head[tag.length] === '>')) return 'html';
	}
	return null;
}

/**
 * Plain text: no NUL and no control characters other than tab, line feed, form feed, carriage
 * return and escape. Bytes above 0x7F pass, so UTF-8 and the 8-bit code pages meters write both
 * count; UTF-16 (full of NUL bytes) does not.
 */
export function isPlainText(bytes: Uint8Array): boolean {
	for (let i = 0; i < bytes.length; i++) {
		const b = bytes[i];
		if (b < 0x20 && b !== 0x09 && b !== 0x0a && b !== 0x0c && b !== 0x0d && b !== 0x1b) return false;
		if (b === 0x7f) return false;
	}
	return true;
}

export function sniff(bytes: Uint8Array): Sniffed {
	if (bytes.length === 0) return 'empty';
	if (startsWith(bytes, PDF)) return 'pdf';
	if (startsWith(bytes, PNG)) return 'png';
	if (startsWith(bytes, JPEG)) return 'jpeg';
	if (startsWith(bytes, ZIP))
		return containsAscii(bytes, '[Content_Types].xml') && containsAscii(bytes, 'xl/workbook.xml') ? 'xlsx' : 'zip';
	if (!isPlainText(bytes)) return 'binary';
	return sniffMarkup(bytes) ?? 'text';
}
