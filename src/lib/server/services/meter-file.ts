/**
 * Meter files → reading rows: CSV through papaparse (RFC 4180 quoting, `,` `;` or tab found by its
 * delimiter detection, BOM, CRLF), the first sheet of an XLSX workbook through xlsx-populate, a guess
 * of the column mapping from the header, and the mapping itself with row-level errors. No I/O.
 */
import Papa from 'papaparse';
import XlsxPopulate from 'xlsx-populate';
import type { ImportMapping, ReadingInputRow } from '$lib/schemas/readings';
import { readingSchema } from '$lib/schemas/readings';

export type Table = string[][];

export interface RowError {
	/** 1-based line/row number in the file, as a spreadsheet shows it. */
	row: number;
	column: string;
	message: string;
}

export interface MappedRows {
	rows: ReadingInputRow[];
	/** File row number (1-based) of each mapped row, parallel to rows. */
	fileRows: number[];
	errors: RowError[];
	skippedEmpty: number;
}

const DELIMITERS = [',', ';', '\t'];

/**
 * The delimiter papaparse finds in the first lines; ',' when none splits them consistently (a file of
 * one column). Empty lines are left out of the guess: a trailing newline would otherwise defeat it.
 */
export function detectDelimiter(text: string): string {
	return Papa.parse<string[]>(text, { preview: 10, skipEmptyLines: 'greedy', delimitersToGuess: DELIMITERS }).meta.delimiter;
}

/** A CSV file whose quoting is broken; `row` is the 1-based record where papaparse found it. */
export class CsvSyntaxError extends Error {
	constructor(
		readonly row: number,
		message: string
	) {
		super(message);
	}
}

/**
 * RFC 4180 CSV: quoted fields may hold delimiters, doubled quotes and line breaks. Empty lines stay
 * in the table (as `['']`) so that row numbers match the file; a final line break adds no row.
 */
export function parseCsv(text: string, delimiter = detectDelimiter(text)): Table {
	const parsed = Papa.parse<string[]>(text, { delimiter, skipEmptyLines: false });
	const broken = parsed.errors.find((e) => e.type === 'Quotes');
	if (broken) throw new CsvSyntaxError((broken.row ?? 0) + 1, broken.message);
	const table = parsed.data;
	const last = table.at(-1);
	if (/[\r\n]$/.test(text) && last?.length === 1 && last[0] === '') table.pop();
	return table;
}

/** A cell value of xlsx-populate as the import reads it: numbers in JavaScript's notation, rich text joined. */
export function xlsxCellText(value: unknown): string {
	if (value === null || value === undefined) return '';
	if (value instanceof Date) return value.toISOString();
	if (typeof value === 'object' && 'text' in value && typeof value.text === 'function') return String(value.text()); // RichText
	if (typeof value === 'object' && 'error' in value && typeof value.error === 'function') return String(value.error()); // FormulaError, e.g. "#N/A"
	return String(value);
}

/**
 * The used range of the first sheet of an .xlsx workbook as text. Dates stay spreadsheet serial
 * numbers (the mapping's time column converts them). Throws when the bytes are not a workbook.
 */
export async function readXlsxTable(bytes: Uint8Array): Promise<Table> {
	const workbook = await XlsxPopulate.fromDataAsync(Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength));
	const values = workbook.sheet(0)?.usedRange()?.value() ?? [];
	return values.map((row) => row.map(xlsxCellText));
}

const HEADER_PATTERNS: Array<[keyof Pick<ImportMapping, 'serial' | 'ocv' | 'temperature' | 'ac_resistance' | 'time'>, RegExp]> = [
	['serial', /serial|\bs\/?n\b|barcode|\bid\b|unit/i],
	['ac_resistance', /resist|\bir\b|\bacir\b|imped|ohm|\br\b/i],
	['ocv', /ocv|voltage|volt|\bu\b|\bv\b|\(m?v\)|\[m?v\]/i],
	['temperature', /temp|°c|\bdeg|\bt\b/i],
	['time', /time|date|stamp|measured/i]
];

/** Guess which column is which from the header row; the OCV unit from "mV" in its header. */
export function guessMapping(header: string[]): Partial<ImportMapping> {
	const used = new Set<number>();
	const mapping: Partial<ImportMapping> = {};
	for (const [field, pattern] of HEADER_PATTERNS) {
		const index = header.findIndex((h, i) => !used.has(i) && pattern.test(h.trim()));
		if (index >= 0) {
			used.add(index);
			mapping[field] = index;
		}
	}
	if (mapping.ocv !== undefined) mapping.ocv_unit = /m\s*v|millivolt/i.test(header[mapping.ocv]) ? 'mV' : 'V';
	mapping.first_row = header.some((h) => /[a-z]/i.test(h) && !/^\s*-?\d/.test(h)) ? 1 : 0;
	return mapping;
}

/** Numbers as meters write them: "3.712", "3,712" (decimal comma), " 3712 mV", "+25.1". */
export function parseNumber(raw: string): number | null {
	const s = raw
		.trim()
		.replace(/\s*(m?v|°?c|m?ω|mohm|ohm)$/i, '')
		.replace(/\s/g, '');
	if (s === '') return null;
	const normal = /^[+-]?\d+,\d+$/.test(s) ? s.replace(',', '.') : s;
	if (!/^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i.test(normal)) return Number.NaN;
	return Number(normal);
}

/** ISO 8601, "YYYY-MM-DD HH:MM[:SS]" (taken as UTC when no zone is given) or a spreadsheet serial day. */
export function parseTime(raw: string): string | null {
	const s = raw.trim();
	if (s === '') return null;
	if (/^\d+(\.\d+)?$/.test(s)) {
		const days = Number(s); // spreadsheet serial date, 1899-12-30 epoch
		return days > 20000 && days < 80000 ? new Date(Math.round((days - 25569) * 86400000)).toISOString() : 'invalid';
	}
	const m = /^(\d{4}-\d{2}-\d{2})[ T](\d{2}:\d{2}(:\d{2}(\.\d+)?)?)(Z|[+-]\d{2}:?\d{2})?$/.exec(s);
	if (!m) return 'invalid';
	const time = m[2].length === 5 ? `${m[2]}:00` : m[2];
	const date = new Date(`${m[1]}T${time}${m[5] ?? 'Z'}`);
	return Number.isNaN(date.getTime()) ? 'invalid' : date.toISOString();
}

const cell = (row: string[], index: number | null | undefined) => (index === null || index === undefined ? '' : (row[index] ?? '').trim());

function mapRow(row: string[], m: ImportMapping, fileRow: number, errors: RowError[]): ReadingInputRow | null {
	const rowErrors: RowError[] = [];
	const number = (column: string, index: number | null | undefined, required: boolean) => {
		const raw = cell(row, index);
		const value = parseNumber(raw);
		if (value === null && required) rowErrors.push({ row: fileRow, column, message: `${column} is empty` });
		else if (value !== null && Number.isNaN(value)) rowErrors.push({ row: fileRow, column, message: `“${raw}” is not a number` });
		return value === null || Number.isNaN(value) ? null : value;
	};
	const ocvRaw = number('OCV', m.ocv, true);
	const tempRaw =
		m.temperature === null || m.temperature === undefined ? (m.default_temperature_c ?? null) : number('temperature', m.temperature, true);
	if (tempRaw === null && (m.temperature === null || m.temperature === undefined)) {
		rowErrors.push({ row: fileRow, column: 'temperature', message: 'no temperature column and no default temperature' });
	}
	const resistance = number('AC resistance', m.ac_resistance, false);
	const time = m.time === null || m.time === undefined ? null : parseTime(cell(row, m.time));
	if (time === 'invalid') rowErrors.push({ row: fileRow, column: 'time', message: `“${cell(row, m.time)}” is not a date-time` });
	const candidate = {
		serial: cell(row, m.serial),
		ocv_v: ocvRaw === null ? Number.NaN : m.ocv_unit === 'mV' ? ocvRaw / 1000 : ocvRaw,
		temperature_c: tempRaw ?? Number.NaN,
		ac_resistance_mohm: resistance,
		measured_at: time === 'invalid' ? null : time
	};
	if (rowErrors.length === 0) {
		const parsed = readingSchema.safeParse(candidate);
		if (parsed.success) return parsed.data;
		for (const issue of parsed.error.issues) rowErrors.push({ row: fileRow, column: String(issue.path[0] ?? ''), message: issue.message });
	}
	errors.push(...rowErrors);
	return null;
}

/** Apply a column mapping to a table; empty lines are skipped, every other bad row is reported. */
export function mapTable(table: Table, mapping: ImportMapping): MappedRows {
	const out: MappedRows = { rows: [], fileRows: [], errors: [], skippedEmpty: 0 };
	for (let i = mapping.first_row; i < table.length; i++) {
		const row = table[i];
		if (row.every((c) => c.trim() === '')) {
			out.skippedEmpty++;
			continue;
		}
		const mapped = mapRow(row, mapping, i + 1, out.errors);
		if (mapped) {
			out.rows.push(mapped);
			out.fileRows.push(i + 1);
		}
	}
	return out;
}
