/**
 * Meter-file import: CSV or XLSX → string table → mapped readings (preview with row-level errors)
 * → one transaction that writes the reading_imports row and the readings. (lot, sha256) is unique,
 * so the same file twice is recognised and answered with the date of the first import.
 */
import { and, eq } from 'drizzle-orm';
import type { SessionUser } from '$lib/roles';
import { MAX_READINGS_PER_CALL, type ImportMapping } from '$lib/schemas/readings';
import type { Database } from '../db';
import { lots, readingImports } from '../db/schema';
import { Invalid, TooLarge } from '../errors';
import { CsvSyntaxError, guessMapping, mapTable, parseCsv, readXlsxTable, type RowError, type Table } from './meter-file';
import { addReadingsTx, type AddReadingsResult } from './readings';
import { sha256Hex } from './uploads';

/** A meter file that passed the upload rules (services/uploads.ts, use `meter_file`). */
export interface MeterFile {
	name: string;
	bytes: Uint8Array;
	/** What the content sniffing found: CSV (plain text) or an XLSX workbook. */
	format: 'csv' | 'xlsx';
}

export interface ImportPreview {
	file_name: string;
	file_sha256: string;
	format: 'csv' | 'xlsx';
	header: string[];
	/** The first rows of the file as text, for the mapping step. */
	sample: string[][];
	guessed_mapping: Partial<ImportMapping>;
	total_rows: number;
	valid_rows: number;
	errors: RowError[];
	/** The first mapped rows, to show next to the errors. */
	rows: Array<{
		row: number;
		serial: string;
		ocv_v: number;
		temperature_c: number;
		ac_resistance_mohm: number | null;
		measured_at: string | null;
	}>;
	already_imported_at: string | null;
}

export interface ImportResult extends AddReadingsResult {
	import_id: string | null;
	already_imported_at: string | null;
	skipped_invalid: number;
}

const PREVIEW_ROWS = 50;
const ERROR_LIMIT = 200;

/** The first sheet as text (xlsx-populate). */
async function readXlsx(bytes: Uint8Array): Promise<Table> {
	try {
		return await readXlsxTable(bytes);
	} catch {
		throw new Invalid('The file looks like a spreadsheet but could not be read as XLSX', [
			{ path: 'file', message: 'not a readable XLSX workbook' }
		]);
	}
}

function readCsv(bytes: Uint8Array): Table {
	const text = new TextDecoder('utf-8', { fatal: false }).decode(bytes);
	if (text.includes('\u0000')) throw new Invalid('The file is neither CSV text nor an XLSX workbook');
	try {
		return parseCsv(text);
	} catch (error) {
		if (!(error instanceof CsvSyntaxError)) throw error;
		throw new Invalid(`The CSV file could not be read: broken quoting in row ${error.row}`, [
			{ path: `row ${error.row}`, message: error.message }
		]);
	}
}

/** The file as a table of strings, by the format its content was sniffed as (never its name). */
export async function readTable(file: MeterFile): Promise<{ table: Table; format: 'csv' | 'xlsx' }> {
	return file.format === 'xlsx' ? { table: await readXlsx(file.bytes), format: 'xlsx' } : { table: readCsv(file.bytes), format: 'csv' };
}

async function previousImport(db: Database, lotId: string, sha: string): Promise<string | null> {
	const [row] = await db
		.select({ at: readingImports.importedAt })
		.from(readingImports)
		.where(and(eq(readingImports.lotId, lotId), eq(readingImports.fileSha256, sha)));
	return row ? row.at.toISOString() : null;
}

/** Parse and map without writing; `mapping` null → the guessed mapping (if it names serial and OCV). */
export async function previewImport(db: Database, lotId: string, file: MeterFile, mapping: ImportMapping | null): Promise<ImportPreview> {
	const { table, format } = await readTable(file);
	const header = table[0] ?? [];
	const guessed = guessMapping(header);
	const sha = sha256Hex(file.bytes);
	const effective = mapping ?? completeMapping(guessed);
	const mapped = effective ? mapTable(table, effective) : null;
	return {
		file_name: file.name,
		file_sha256: sha,
		format,
		header,
		sample: table.slice(0, 8),
		guessed_mapping: guessed,
		total_rows: Math.max(0, table.length - (effective?.first_row ?? 1) - (mapped?.skippedEmpty ?? 0)),
		valid_rows: mapped?.rows.length ?? 0,
		errors: mapped?.errors.slice(0, ERROR_LIMIT) ?? [],
		rows: (mapped?.rows.slice(0, PREVIEW_ROWS) ?? []).map((r, i) => ({
			row: mapped!.fileRows[i],
			serial: r.serial,
			ocv_v: r.ocv_v,
			temperature_c: r.temperature_c,
			ac_resistance_mohm: r.ac_resistance_mohm ?? null,
			measured_at: r.measured_at ?? null
		})),
		already_imported_at: await previousImport(db, lotId, sha)
	};
}

/** A guessed mapping that names at least serial and OCV, with defaults for the rest. */
function completeMapping(g: Partial<ImportMapping>): ImportMapping | null {
	if (g.serial === undefined || g.ocv === undefined) return null;
	return { ocv_unit: 'V', first_row: 1, skip_invalid: false, ...g } as ImportMapping;
}

/** Write the import, all or nothing. Rows with errors refuse the file unless mapping.skip_invalid. */
export async function commitImport(
	db: Database,
	user: SessionUser,
	lotId: string,
	file: MeterFile,
	mapping: ImportMapping
): Promise<ImportResult> {
	const { table } = await readTable(file);
	const sha = sha256Hex(file.bytes);
	const mapped = mapTable(table, mapping);
	if (mapped.errors.length > 0 && !mapping.skip_invalid) {
		throw new Invalid(
			`${new Set(mapped.errors.map((e) => e.row)).size} row(s) of the file have errors; nothing was imported`,
			mapped.errors.slice(0, ERROR_LIMIT).map((e) => ({ path: `row ${e.row}.${e.column}`, message: e.message }))
		);
	}
	if (mapped.rows.length === 0) throw new Invalid('The file has no valid readings with this mapping');
	if (mapped.rows.length > MAX_READINGS_PER_CALL) {
		throw new TooLarge(
			`A meter file may hold at most ${MAX_READINGS_PER_CALL} readings (this one has ${mapped.rows.length})`,
			'too_many_readings'
		);
	}
	const skipped = new Set(mapped.errors.map((e) => e.row)).size;
	return db.transaction(async (tx) => {
		const [created] = await tx
			.insert(readingImports)
			.values({ lotId, fileName: file.name.slice(0, 200), fileSha256: sha, rowCount: mapped.rows.length, importedBy: user.id })
			.onConflictDoNothing()
			.returning({ id: readingImports.id });
		if (!created) {
			const [previous] = await tx
				.select({ at: readingImports.importedAt, status: lots.status })
				.from(readingImports)
				.innerJoin(lots, eq(lots.id, readingImports.lotId))
				.where(and(eq(readingImports.lotId, lotId), eq(readingImports.fileSha256, sha)));
			return {
				inserted: 0,
				duplicates: mapped.rows.length,
				lot_status: previous?.status ?? '',
				arrived: false,
				stored: [],
				import_id: null,
				already_imported_at: previous?.at.toISOString() ?? null,
				skipped_invalid: skipped
			};
		}
		const added = await addReadingsTx(tx, user, lotId, mapped.rows, 'import', created.id, (i) => `row ${mapped.fileRows[i]}.OCV`);
		return { ...added, import_id: created.id, already_imported_at: null, skipped_invalid: skipped };
	});
}
