/**
 * A direct reader for the first sheet of an .xlsx workbook → table of strings, for meter imports.
 * No workbook object model: zip central directory → inflateRawSync of the few parts needed → one
 * linear pass over sharedStrings.xml and the sheet XML. The table matches what the import got from
 * xlsx-populate's `usedRange().value()` (tested against it): rows and columns from the first to
 * the last cell present, numbers as `String(Number(v))` (dates stay spreadsheet serial numbers, as
 * before; the mapping's time column converts them), booleans as "true"/"false", absent cells "".
 * Server-only (node:zlib).
 */
import { inflateRawSync } from 'node:zlib';

export type Table = string[][];

/** The bytes are not a workbook this reader understands. */
export class XlsxReadError extends Error {}

/** Largest inflated part we accept (a 10 MB upload of sheet XML inflates to far less). */
const MAX_PART_BYTES = 256 * 1024 * 1024;

// ------------------------------------------------------------------ zip

interface ZipEntry {
	method: number;
	compressedSize: number;
	localHeaderOffset: number;
}

/** End-of-central-directory record: the last 22+ bytes of the archive (after an optional comment). */
function findEndOfDirectory(buf: Buffer): number {
	const lowest = Math.max(0, buf.length - 22 - 0xffff);
	for (let i = buf.length - 22; i >= lowest; i--) if (buf.readUInt32LE(i) === 0x06054b50) return i;
	throw new XlsxReadError('no zip directory');
}

export function zipDirectory(buf: Buffer): Map<string, ZipEntry> {
	const end = findEndOfDirectory(buf);
	const count = buf.readUInt16LE(end + 10);
	let at = buf.readUInt32LE(end + 16);
	const entries = new Map<string, ZipEntry>();
	for (let i = 0; i < count; i++) {
		if (at + 46 > buf.length || buf.readUInt32LE(at) !== 0x02014b50) throw new XlsxReadError('broken zip directory');
		const nameLength = buf.readUInt16LE(at + 28);
		const name = buf.toString('utf8', at + 46, at + 46 + nameLength);
		entries.set(name, { method: buf.readUInt16LE(at + 10), compressedSize: buf.readUInt32LE(at + 20), localHeaderOffset: buf.readUInt32LE(at + 42) });
		at += 46 + nameLength + buf.readUInt16LE(at + 30) + buf.readUInt16LE(at + 32);
	}
	return entries;
}

function readEntry(buf: Buffer, entry: ZipEntry): string {
	const at = entry.localHeaderOffset;
	if (at + 30 > buf.length || buf.readUInt32LE(at) !== 0x04034b50) throw new XlsxReadError('broken zip entry');
	const start = at + 30 + buf.readUInt16LE(at + 26) + buf.readUInt16LE(at + 28);
	const data = buf.subarray(start, start + entry.compressedSize);
	if (entry.method === 0) return data.toString('utf8');
	if (entry.method !== 8) throw new XlsxReadError(`unsupported zip method ${entry.method}`);
	return inflateRawSync(data, { maxOutputLength: MAX_PART_BYTES }).toString('utf8');
}

// ------------------------------------------------------------------ xml helpers

const ENTITIES: Record<string, string> = { amp: '&', lt: '<', gt: '>', quot: '"', apos: "'" };

export function decodeXml(text: string): string {
	if (!text.includes('&')) return text;
	return text.replace(/&(#x[0-9a-fA-F]+|#[0-9]+|amp|lt|gt|quot|apos);/g, (_, e: string) =>
		e[0] !== '#' ? ENTITIES[e] : String.fromCodePoint(e[1] === 'x' || e[1] === 'X' ? parseInt(e.slice(2), 16) : parseInt(e.slice(1), 10))
	);
}

const attrPattern = (name: string) => new RegExp(`(?:^|[\\s:])${name}\\s*=\\s*(?:"([^"]*)"|'([^']*)')`);
/** Attribute patterns by local name (prefix ignored, so r:id and x:r both work). */
const ATTR = { r: attrPattern('r'), t: attrPattern('t'), id: attrPattern('id'), Id: attrPattern('Id'), Type: attrPattern('Type'), Target: attrPattern('Target') };

function attr(tag: string, name: keyof typeof ATTR): string | undefined {
	const m = ATTR[name].exec(tag);
	return m ? decodeXml(m[1] ?? m[2]) : undefined;
}

/** Text of a <t> element as the previous reader saw it: whitespace-only text counts only with xml:space="preserve". */
function textOf(openTag: string, raw: string): string {
	if (raw.trim() === '' && !/xml:space\s*=\s*["']preserve/.test(openTag)) return '';
	return decodeXml(raw);
}

const T_PATTERN = /<(?:\w+:)?t(\s[^>]*)?(?:\/>|>([\s\S]*?)<\/(?:\w+:)?t>)/g;

/** Text of a string item (<si> or <is>): its <t>, or the <t> of each rich-text run; phonetic runs left out. */
function stringItemText(inner: string): string {
	const body = inner.replace(/<(?:\w+:)?rPh\b[\s\S]*?<\/(?:\w+:)?rPh>/g, '');
	let text = '';
	for (const m of body.matchAll(T_PATTERN)) text += m[2] === undefined ? '' : textOf(m[1] ?? '', m[2]);
	return text;
}

export function parseSharedStrings(xml: string): string[] {
	const out: string[] = [];
	for (const m of xml.matchAll(/<(?:\w+:)?si(?:\s[^>]*)?(?:\/>|>([\s\S]*?)<\/(?:\w+:)?si>)/g)) out.push(m[1] === undefined ? '' : stringItemText(m[1]));
	return out;
}

// ------------------------------------------------------------------ workbook parts

interface Relationship {
	type: string;
	target: string;
}

function relationships(xml: string): Map<string, Relationship> {
	const rels = new Map<string, Relationship>();
	for (const m of xml.matchAll(/<(?:\w+:)?Relationship\s[^>]*>/g)) {
		const id = attr(m[0], 'Id');
		if (id) rels.set(id, { type: attr(m[0], 'Type') ?? '', target: attr(m[0], 'Target') ?? '' });
	}
	return rels;
}

/** A relationship target as a zip path: absolute ("/xl/…") or relative to the source part's folder. */
function resolvePart(fromFolder: string, target: string): string {
	const parts = (target.startsWith('/') ? target.slice(1) : fromFolder + target).split('/');
	const out: string[] = [];
	for (const p of parts) {
		if (p === '..') out.pop();
		else if (p !== '.' && p !== '') out.push(p);
	}
	return out.join('/');
}

const folderOf = (path: string) => path.slice(0, path.lastIndexOf('/') + 1);

interface SheetParts {
	sheet: string;
	sharedStrings: string | null;
}

/** The first sheet in workbook order (not by file name) and the shared-strings part. */
function locateParts(read: (path: string) => string | null): SheetParts {
	const rootRels = read('_rels/.rels');
	const office = rootRels ? [...relationships(rootRels).values()].find((r) => r.type.endsWith('/officeDocument')) : undefined;
	const workbookPath = office ? resolvePart('', office.target) : 'xl/workbook.xml';
	const workbook = read(workbookPath);
	const workbookRels = read(`${folderOf(workbookPath)}_rels/${workbookPath.slice(folderOf(workbookPath).length)}.rels`);
	if (!workbook || !workbookRels) throw new XlsxReadError('no workbook part');
	const rels = relationships(workbookRels);
	const firstSheet = /<(?:\w+:)?sheet\s[^>]*>/.exec(workbook);
	const sheetRel = firstSheet ? rels.get(attr(firstSheet[0], 'id') ?? '') : undefined;
	if (!sheetRel) throw new XlsxReadError('the workbook has no sheet');
	const shared = [...rels.values()].find((r) => r.type.endsWith('/sharedStrings'));
	return {
		sheet: resolvePart(folderOf(workbookPath), sheetRel.target),
		sharedStrings: shared ? resolvePart(folderOf(workbookPath), shared.target) : null
	};
}

// ------------------------------------------------------------------ sheet

/** "AA12" → column 27 (1-based), row 12. */
export function cellRef(ref: string): { column: number; row: number } | null {
	const m = /^\$?([A-Za-z]{1,3})\$?(\d+)$/.exec(ref);
	if (!m) return null;
	let column = 0;
	for (const ch of m[1].toUpperCase()) column = column * 26 + (ch.charCodeAt(0) - 64);
	return { column, row: Number(m[2]) };
}

/** The value text of a cell, as the import always read it. */
function cellValue(type: string | undefined, inner: string, shared: readonly string[]): string {
	if (type === 'inlineStr') {
		const is = /<(?:\w+:)?is(?:\s[^>]*)?>([\s\S]*?)<\/(?:\w+:)?is>/.exec(inner);
		return is ? stringItemText(is[1]) : '';
	}
	const v = /<(?:\w+:)?v(\s[^>]*)?>([\s\S]*?)<\/(?:\w+:)?v>/.exec(inner);
	if (!v) return '';
	const raw = v[2];
	switch (type) {
		case 's':
			return shared[Number(raw)] ?? '';
		case 'str':
			return textOf(v[1] ?? '', raw);
		case 'b':
			return raw.trim() === '1' ? 'true' : 'false';
		case 'e':
		case 'd':
			return decodeXml(raw.trim());
		default:
			return raw.trim() === '' ? '' : String(Number(raw));
	}
}

interface SheetCells {
	cells: Map<number, Map<number, string>>;
	minRow: number;
	maxRow: number;
	minColumn: number;
	maxColumn: number;
}

/** One pass over <sheetData>: every <row> and <c> present (empty styled cells count as used, as before). */
export function parseSheet(xml: string, shared: readonly string[]): SheetCells {
	const out: SheetCells = { cells: new Map(), minRow: Infinity, maxRow: 0, minColumn: Infinity, maxColumn: 0 };
	const tags = /<(?:\w+:)?(row|c)(\s[^>]*?)?(\/?)>|<\/(?:\w+:)?sheetData>/g;
	tags.lastIndex = Math.max(0, xml.search(/<(?:\w+:)?sheetData[\s>\/]/));
	let rowNumber = 0;
	let column = 0;
	let row: Map<number, string> | undefined;
	for (let m = tags.exec(xml); m; m = tags.exec(xml)) {
		if (!m[1]) break; // </sheetData>
		const attrs = m[2] ?? '';
		if (m[1] === 'row') {
			rowNumber = Number(attr(attrs, 'r') ?? rowNumber + 1);
			column = 0;
			row = out.cells.get(rowNumber) ?? new Map();
			out.cells.set(rowNumber, row);
			out.minRow = Math.min(out.minRow, rowNumber);
			out.maxRow = Math.max(out.maxRow, rowNumber);
			continue;
		}
		if (!row) throw new XlsxReadError('a cell outside a row');
		const ref = attr(attrs, 'r');
		const at = ref ? cellRef(ref) : { column: column + 1, row: rowNumber };
		if (!at || at.row !== rowNumber) throw new XlsxReadError(`bad cell reference ${ref}`);
		column = at.column;
		let inner = '';
		if (m[3] !== '/') {
			const close = closingCell(xml, tags.lastIndex);
			if (close < 0) throw new XlsxReadError('unclosed cell');
			inner = xml.slice(tags.lastIndex, close);
			tags.lastIndex = close;
		}
		row.set(column, cellValue(attr(attrs, 't'), inner, shared));
		out.minColumn = Math.min(out.minColumn, column);
		out.maxColumn = Math.max(out.maxColumn, column);
	}
	return out;
}

/** Index of the </c> that closes the cell whose content starts at `from`. */
function closingCell(xml: string, from: number): number {
	const close = /<\/(?:\w+:)?c>/g;
	close.lastIndex = from;
	return close.exec(xml)?.index ?? -1;
}

function toTable(s: SheetCells): Table {
	if (s.maxRow === 0 || s.maxColumn === 0) return [];
	const table: Table = [];
	const width = s.maxColumn - s.minColumn + 1;
	for (let r = s.minRow; r <= s.maxRow; r++) {
		const cells = s.cells.get(r);
		const line = new Array<string>(width);
		for (let c = 0; c < width; c++) line[c] = cells?.get(s.minColumn + c) ?? '';
		table.push(line);
	}
	return table;
}

/** The first sheet of an .xlsx file as a table of strings; throws XlsxReadError when unreadable. */
export function readXlsxTable(bytes: Uint8Array): Table {
	const buf = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	try {
		const entries = zipDirectory(buf);
		const read = (path: string) => {
			const entry = entries.get(path);
			return entry ? readEntry(buf, entry) : null;
		};
		const parts = locateParts(read);
		const sheetXml = read(parts.sheet);
		if (sheetXml === null) throw new XlsxReadError('the first sheet is missing');
		const sharedXml = parts.sharedStrings ? read(parts.sharedStrings) : null;
		return toTable(parseSheet(sheetXml, sharedXml ? parseSharedStrings(sharedXml) : []));
	} catch (error) {
		if (error instanceof XlsxReadError) throw error;
		throw new XlsxReadError(error instanceof Error ? error.message : String(error));
	}
}
