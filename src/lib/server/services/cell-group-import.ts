/**
 * BMS readout import: the cell-group voltages of packs already measured on the bench.
 *
 * Layout (CSV; `,` `;` or tab, decimal point or comma; an XLSX first sheet is read the same way):
 *   serial,group_1,group_2,…,group_N
 *   PK-0001,3.651,3.649,…,3.652
 * The first row is a header (any text). Each following row is one unit: its serial, then one voltage
 * per cell group in volts, N = the part's cells in series. Each row sets the groups of that unit's
 * latest reading in the lot; all rows are stored or none, and replaced values go to the audit trail.
 */
import { and, desc, eq } from 'drizzle-orm';
import type { SessionUser } from '$lib/roles';
import { cellGroupProblems } from '$lib/inspection/cell-groups';
import { lotStateInText } from '$lib/status';
import type { Database, Tx } from '../db';
import { parts, lots, readings } from '../db/schema';
import { Conflict, Invalid, type Issue } from '../errors';
import { recordAudit } from './audit';
import type { MeterFile } from './imports';
import { readTable } from './imports';
import { parseNumber, type Table } from './meter-file';
import { CORRECTABLE, lockLot } from './readings';
import { sha256Hex } from './uploads';

export interface CellGroupRow {
	/** 1-based row of the file. */
	row: number;
	serial: string;
	voltages: number[];
}

export interface CellGroupImportResult {
	updated: number;
	readings: Array<{ serial: string; reading_id: number; min_v: number; max_v: number }>;
}

const ISSUE_LIMIT = 200;

/** The table's rows after the header as serial + voltages; unreadable cells become issues. */
export function cellGroupRows(table: Table): { rows: CellGroupRow[]; issues: Issue[] } {
	const rows: CellGroupRow[] = [];
	const issues: Issue[] = [];
	table.slice(1).forEach((cells, i) => {
		const row = i + 2;
		if (cells.every((c) => c.trim() === '')) return;
		const serial = (cells[0] ?? '').trim();
		if (serial === '') issues.push({ path: `row ${row}.serial`, message: 'serial is empty' });
		const raw = cells.slice(1);
		while (raw.length > 0 && raw.at(-1)?.trim() === '') raw.pop(); // trailing delimiters
		const voltages = raw.map((text) => parseNumber(text) ?? Number.NaN);
		const bad = voltages.flatMap((v, g) => (Number.isNaN(v) ? [g + 1] : []));
		if (bad.length > 0) issues.push({ path: `row ${row}.group_${bad[0]}`, message: `group(s) ${bad.join(', ')} are not numbers` });
		else if (serial !== '') rows.push({ row, serial, voltages });
	});
	const seen = new Map<string, number>();
	for (const r of rows) {
		const first = seen.get(r.serial);
		if (first !== undefined) issues.push({ path: `row ${r.row}.serial`, message: `${r.serial} is also in row ${first}` });
		else seen.set(r.serial, r.row);
	}
	return { rows, issues };
}

async function seriesOf(tx: Tx, lotId: string): Promise<number> {
	const [row] = await tx
		.select({ series: parts.cellsInSeries })
		.from(lots)
		.innerJoin(parts, eq(parts.id, lots.partId))
		.where(eq(lots.id, lotId));
	return row.series;
}

async function latestReading(tx: Tx, lotId: string, serial: string) {
	const [row] = await tx
		.select({ id: readings.id, ocv_v: readings.ocvV, before: readings.cellGroupVoltages })
		.from(readings)
		.where(and(eq(readings.lotId, lotId), eq(readings.serial, serial)))
		.orderBy(desc(readings.measuredAt), desc(readings.id))
		.limit(1);
	return row ?? null;
}

/** Match every row to its unit's latest reading and check it against the part; nothing is written. */
async function plan(tx: Tx, lotId: string, rows: CellGroupRow[]) {
	const cellsInSeries = await seriesOf(tx, lotId);
	const issues: Issue[] = [];
	const matched: Array<CellGroupRow & { readingId: number; before: number[] | null }> = [];
	for (const r of rows) {
		const reading = await latestReading(tx, lotId, r.serial);
		if (!reading) {
			issues.push({ path: `row ${r.row}.serial`, message: `no reading of ${r.serial} in this lot; record its pack OCV first` });
			continue;
		}
		const problems = cellGroupProblems(r.voltages, { cells_in_series: cellsInSeries, ocv_v: reading.ocv_v });
		for (const message of problems) issues.push({ path: `row ${r.row}.cell_group_voltages`, message });
		if (problems.length === 0) matched.push({ ...r, readingId: reading.id, before: reading.before });
	}
	return { matched, issues };
}

/** Store the groups of a BMS readout file, all or nothing (422 naming the rows when any does not fit). */
export async function importCellGroups(db: Database, user: SessionUser, lotId: string, file: MeterFile): Promise<CellGroupImportResult> {
	const { table } = await readTable(file);
	const parsed = cellGroupRows(table);
	if (parsed.rows.length === 0 && parsed.issues.length === 0)
		throw new Invalid('The file has no rows after its header', [{ path: 'file', message: 'no units' }]);
	return db.transaction(async (tx) => {
		const lot = await lockLot(tx, lotId);
		if (!CORRECTABLE.includes(lot.status))
			throw new Conflict(
				`Cell groups can be added while the lot is on the bench, awaiting decision or on hold (it is ${lotStateInText(lot.status)})`
			);
		const { matched, issues } = await plan(tx, lotId, parsed.rows);
		const all = [...parsed.issues, ...issues];
		if (all.length > 0) throw new Invalid(`${all.length} problem(s) in the BMS file; nothing was stored`, all.slice(0, ISSUE_LIMIT));
		for (const m of matched) await tx.update(readings).set({ cellGroupVoltages: m.voltages }).where(eq(readings.id, m.readingId));
		await recordAudit(tx, {
			actorId: user.id,
			actorEmail: user.email,
			action: 'readings.cell_groups_imported',
			entityType: 'lot',
			entityId: lotId,
			lotId,
			details: {
				file_name: file.name,
				file_sha256: sha256Hex(file.bytes),
				count: matched.length,
				replaced: matched.filter((m) => m.before).map((m) => ({ reading_id: m.readingId, before: m.before }))
			}
		});
		return {
			updated: matched.length,
			readings: matched.map((m) => ({
				serial: m.serial,
				reading_id: m.readingId,
				min_v: Math.min(...m.voltages),
				max_v: Math.max(...m.voltages)
			}))
		};
	});
}
