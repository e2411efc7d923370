/**
 * Unit readings of a lot: all-or-nothing batch insert (keyboard grid, meter import, API), listing,
 * and audited corrections before the decision. The first reading of a lot awaiting arrival records
 * its arrival and moves it into inspection.
 */
import { and, asc, eq, sql } from 'drizzle-orm';
import type { z } from 'zod';
import type { SessionUser } from '$lib/roles';
import { MAX_READINGS_PER_CALL, readingSchema, type ReadingCorrection, type ReadingInputRow } from '$lib/schemas/readings';
import { lotStateInText } from '$lib/status';
import { cellGroupProblems } from '$lib/inspection/cell-groups';
import type { Database, Tx } from '../db';
import { readings } from '../db/schema';
import { Conflict, Invalid, NotFound, TooLarge, type Issue } from '../errors';
import { guardOcv, implausibleMessage, type GuardPart } from '$lib/inspection/entry-guard';
import { recordAudit } from './audit';
import { recordArrival, transitionLot } from './lots';
import { requiredSampleSize } from './evaluation';

export type ReadingSource = 'keyboard' | 'import' | 'api';
/** Lots that take new readings; awaiting_arrival is moved into inspection by the first batch. */
// A lot awaiting its decision (sample complete) still takes readings: extra units, second OCVs.
const OPEN_STATUSES = ['awaiting_arrival', 'in_inspection', 'pending_decision'] as const;
/** A held lot may be corrected too: quality then re-evaluates it (a new evaluation row). */
export const CORRECTABLE = ['in_inspection', 'pending_decision', 'on_hold'];
/** Rows per INSERT … SELECT FROM unnest(…): one round trip per chunk, parameters stay arrays. */
const CHUNK = 5000;

export interface AddReadingsResult {
	inserted: number;
	/** Rows skipped because their client_key was already stored (a retried save). */
	duplicates: number;
	lot_status: string;
	arrived: boolean;
	/** The stored id of every row of the batch that carried a client_key (new or stored before), so a bench row can be corrected later. */
	stored: Array<{ client_key: string; id: number }>;
}

export interface StoredReading {
	id: number;
	serial: string;
	ocv_v: number;
	temperature_c: number;
	ac_resistance_mohm: number | null;
	measured_at: string;
	source: ReadingSource;
	client_key: string | null;
	import_id: string | null;
	/** A pack's cell-group voltages, V (null when not recorded). */
	cell_group_voltages: number[] | null;
	/** An OCV outside the part's plausible window that the inspector confirmed. */
	confirmed_out_of_window: boolean;
}

interface LockedLot {
	id: string;
	status: string;
	supplier_id: string;
}

/** Lock the lot row so concurrent batches and the submit see one order of events. */
export async function lockLot(tx: Tx, lotId: string): Promise<LockedLot> {
	const result = await tx.execute<LockedLot & Record<string, unknown>>(
		sql`select id, status::text as status, supplier_id from lots where id = ${lotId} for update`
	);
	const lot = result.rows[0];
	if (!lot) throw new NotFound('lot');
	return lot;
}

/** Validate every row before anything is written; row-level issues are reported together. */
export function validateReadings(rows: unknown[]): ReadingInputRow[] {
	if (rows.length === 0) throw new Invalid('Send at least one reading');
	if (rows.length > MAX_READINGS_PER_CALL) {
		throw new TooLarge(`At most ${MAX_READINGS_PER_CALL} readings per call (got ${rows.length}); split the batch`, 'too_many_readings');
	}
	const issues: Issue[] = [];
	const valid: ReadingInputRow[] = [];
	rows.forEach((row, i) => {
		const parsed = readingSchema.safeParse(row);
		if (parsed.success) valid.push(parsed.data);
		else
			for (const issue of (parsed.error as z.ZodError).issues)
				issues.push({ path: ['readings', i, ...issue.path].join('.'), message: issue.message });
	});
	if (issues.length > 0)
		throw new Invalid(
			`${new Set(issues.map((i) => i.path.split('.')[1])).size} reading(s) are not valid; nothing was stored`,
			issues.slice(0, 200)
		);
	return valid;
}

async function insertChunk(
	tx: Tx,
	lotId: string,
	user: SessionUser,
	rows: ReadingInputRow[],
	confirmedOutOfWindow: boolean[],
	source: ReadingSource,
	importId: string | null
): Promise<number> {
	const now = new Date().toISOString();
	const result = await tx.execute(sql`
		insert into readings (lot_id, serial, ocv_v, temperature_c, ac_resistance_mohm, measured_at, client_key, cell_group_voltages, confirmed_out_of_window, source, import_id, entered_by)
		select ${lotId}::uuid, u.serial, u.ocv_v, u.temperature_c, u.ac_resistance_mohm, u.measured_at, u.client_key,
		       u.cell_groups::float8[], u.confirmed, ${source}::reading_source, ${importId}::uuid, ${user.id}
		from unnest(
			${sql.param(rows.map((r) => r.serial))}::text[],
			${sql.param(rows.map((r) => r.ocv_v))}::float8[],
			${sql.param(rows.map((r) => r.temperature_c))}::float8[],
			${sql.param(rows.map((r) => r.ac_resistance_mohm ?? null))}::float8[],
			${sql.param(rows.map((r) => r.measured_at ?? now))}::timestamptz[],
			${sql.param(rows.map((r) => r.client_key ?? null))}::text[],
			${sql.param(rows.map((r) => groupsLiteral(r.cell_group_voltages)))}::text[],
			${sql.param(confirmedOutOfWindow)}::boolean[]
		) as u(serial, ocv_v, temperature_c, ac_resistance_mohm, measured_at, client_key, cell_groups, confirmed)
		on conflict (lot_id, client_key) do nothing`);
	return result.rowCount ?? 0;
}

/** A list of voltages as a PostgreSQL array literal: unnest cannot carry one array per row of a 2-D array. */
function groupsLiteral(voltages: number[] | null | undefined): string | null {
	return voltages ? `{${voltages.join(',')}}` : null;
}

/** Rows that carry cell-group voltages must match the part (count = cells in series, sum ≈ pack OCV). */
async function checkCellGroups(tx: Tx, lotId: string, rows: ReadingInputRow[]): Promise<void> {
	if (!rows.some((r) => r.cell_group_voltages)) return;
	const [{ cells_in_series }] = (
		await tx.execute<{ cells_in_series: number }>(
			sql`select p.cells_in_series from lots l join parts p on p.id = l.part_id where l.id = ${lotId}`
		)
	).rows;
	const issues: Issue[] = rows.flatMap((r, i) =>
		r.cell_group_voltages
			? cellGroupProblems(r.cell_group_voltages, { cells_in_series, ocv_v: r.ocv_v }).map((message) => ({
					path: `readings.${i}.cell_group_voltages`,
					message
				}))
			: []
	);
	if (issues.length > 0)
		throw new Invalid(`Cell-group voltages of ${issues.length} reading(s) do not fit the part; nothing was stored`, issues.slice(0, 200));
}

async function guardPart(tx: Tx, lotId: string): Promise<GuardPart> {
	const [part] = (
		await tx.execute<GuardPart & Record<string, unknown>>(
			sql`select p.ocv_min_cell_v, p.ocv_max_cell_v, p.cells_in_series from lots l join parts p on p.id = l.part_id where l.id = ${lotId}`
		)
	).rows;
	return part;
}

/**
 * The entry guard: an OCV outside the part's plausible window is refused (422 implausible_reading,
 * nothing stored) unless its row is confirmed. `label(i)` names the row in the issues (a file row for an import).
 */
function refuseImplausible(
	part: GuardPart,
	rows: Array<{ ocv_v?: number; confirmed?: boolean | null }>,
	label: (i: number) => string
): void {
	const issues: Issue[] = rows.flatMap((r, i) =>
		r.ocv_v !== undefined && !r.confirmed && !guardOcv(r.ocv_v, part).plausible
			? [{ path: label(i), message: implausibleMessage(r.ocv_v, part) }]
			: []
	);
	if (issues.length > 0)
		throw new Invalid(
			`${issues.length} reading(s) lie far outside the part's window; nothing was stored. Fix them, or confirm each value that is right.`,
			issues.slice(0, 200),
			'implausible_reading'
		);
}

/** Inside an open transaction (used by the meter import, which also writes its import row). */
export async function addReadingsTx(
	tx: Tx,
	user: SessionUser,
	lotId: string,
	rows: ReadingInputRow[],
	source: ReadingSource,
	importId: string | null = null,
	rowLabel: (i: number) => string = (i) => `readings.${i}.ocv_v`
): Promise<AddReadingsResult> {
	const lot = await lockLot(tx, lotId);
	if (!(OPEN_STATUSES as readonly string[]).includes(lot.status)) {
		throw new Conflict(
			`This lot is ${lotStateInText(lot.status)}; readings can only be added while it is awaiting arrival, on the bench or awaiting decision`
		);
	}
	await checkCellGroups(tx, lotId, rows);
	const part = await guardPart(tx, lotId);
	refuseImplausible(part, rows, rowLabel);
	const outOfWindow = rows.map((r) => !guardOcv(r.ocv_v, part).plausible);
	const arrived = lot.status === 'awaiting_arrival';
	if (arrived) await recordArrival(tx, user, lotId);
	let inserted = 0;
	for (let i = 0; i < rows.length; i += CHUNK)
		inserted += await insertChunk(tx, lotId, user, rows.slice(i, i + CHUNK), outOfWindow.slice(i, i + CHUNK), source, importId);
	if (inserted > 0) {
		await recordAudit(tx, {
			actorId: user.id,
			actorEmail: user.email,
			action: 'readings.added',
			entityType: 'lot',
			entityId: lotId,
			lotId,
			details: { count: inserted, source, import_id: importId }
		});
	}
	const complete = await markSampleCompleteIfDue(tx, user, lotId);
	const lotStatus = complete || lot.status === 'pending_decision' ? 'pending_decision' : 'in_inspection';
	return { inserted, duplicates: rows.length - inserted, lot_status: lotStatus, arrived, stored: await idsOfClientKeys(tx, lotId, rows) };
}

async function idsOfClientKeys(tx: Tx, lotId: string, rows: ReadingInputRow[]): Promise<AddReadingsResult['stored']> {
	const keys = rows.flatMap((r) => (r.client_key ? [r.client_key] : []));
	if (keys.length === 0) return [];
	return tx
		.select({ client_key: sql<string>`${readings.clientKey}`, id: readings.id })
		.from(readings)
		.where(and(eq(readings.lotId, lotId), sql`${readings.clientKey} = any(${sql.param(keys)}::text[])`))
		.orderBy(asc(readings.id));
}

/**
 * When the lot's distinct measured units reach the plan's sample size, the lot moves from
 * "in inspection" to "awaiting decision": the sample is complete and the inspector can submit it.
 */
async function markSampleCompleteIfDue(tx: Tx, user: SessionUser, lotId: string): Promise<boolean> {
	const [{ units, status }] = (
		await tx.execute<{ units: number; status: string }>(
			sql`select (select count(distinct serial) from readings where lot_id = ${lotId})::int as units, status::text as status from lots where id = ${lotId}`
		)
	).rows;
	if (status !== 'in_inspection') return false;
	const needed = await requiredSampleSize(tx, lotId);
	if (units < needed) return false;
	await transitionLot(tx, lotId, ['in_inspection'], 'pending_decision');
	await recordAudit(tx, {
		actorId: user.id,
		actorEmail: user.email,
		action: 'lot.sample_complete',
		entityType: 'lot',
		entityId: lotId,
		lotId,
		details: { units, sample_size: needed, to: 'pending_decision' }
	});
	return true;
}

/**
 * Store a batch of readings, all or nothing. `clientKeys[i]` (or rows[i].client_key) makes a retried
 * save idempotent: a key already stored for the lot is skipped, not duplicated.
 */
export async function addReadings(
	db: Database,
	user: SessionUser,
	lotId: string,
	rows: unknown[],
	source: ReadingSource,
	opts: { clientKeys?: Array<string | null>; importId?: string | null } = {}
): Promise<AddReadingsResult> {
	const valid = validateReadings(rows);
	if (opts.clientKeys) valid.forEach((r, i) => (r.client_key = opts.clientKeys?.[i] ?? r.client_key ?? null));
	return db.transaction((tx) => addReadingsTx(tx, user, lotId, valid, source, opts.importId ?? null));
}

const selectColumns = {
	id: readings.id,
	serial: readings.serial,
	ocv_v: readings.ocvV,
	temperature_c: readings.temperatureC,
	ac_resistance_mohm: readings.acResistanceMohm,
	measured_at: readings.measuredAt,
	source: readings.source,
	client_key: readings.clientKey,
	import_id: readings.importId,
	cell_group_voltages: readings.cellGroupVoltages,
	confirmed_out_of_window: readings.confirmedOutOfWindow
};

/** All readings of a lot in the order they were stored. */
export async function listReadings(db: Database | Tx, lotId: string): Promise<StoredReading[]> {
	const rows = await db.select(selectColumns).from(readings).where(eq(readings.lotId, lotId)).orderBy(asc(readings.id));
	return rows.map((r) => ({ ...r, measured_at: r.measured_at.toISOString() }));
}

/** Fix a wrongly typed value before the decision; the old and new values go to the audit trail. */
export async function correctReading(
	db: Database,
	user: SessionUser,
	lotId: string,
	readingId: number,
	change: ReadingCorrection
): Promise<StoredReading> {
	return db.transaction(async (tx) => {
		const lot = await lockLot(tx, lotId);
		if (!CORRECTABLE.includes(lot.status))
			throw new Conflict(
				`Readings can only be corrected before a final decision or while the lot is on hold (it is ${lotStateInText(lot.status)})`
			);
		const [before] = await tx
			.select(selectColumns)
			.from(readings)
			.where(and(eq(readings.id, readingId), eq(readings.lotId, lotId)));
		if (!before) throw new NotFound('reading');
		const part = await guardPart(tx, lotId);
		refuseImplausible(part, [change], () => 'ocv_v');
		const patch = {
			...(change.ocv_v !== undefined ? { confirmedOutOfWindow: !guardOcv(change.ocv_v, part).plausible } : {}),
			...(change.serial !== undefined ? { serial: change.serial } : {}),
			...(change.ocv_v !== undefined ? { ocvV: change.ocv_v } : {}),
			...(change.temperature_c !== undefined ? { temperatureC: change.temperature_c } : {}),
			...(change.ac_resistance_mohm !== undefined ? { acResistanceMohm: change.ac_resistance_mohm } : {})
		};
		const [after] = await tx.update(readings).set(patch).where(eq(readings.id, readingId)).returning(selectColumns);
		await recordAudit(tx, {
			actorId: user.id,
			actorEmail: user.email,
			action: 'reading.corrected',
			entityType: 'reading',
			entityId: String(readingId),
			lotId,
			details: {
				reason: change.reason,
				before: { ...before, measured_at: before.measured_at.toISOString() },
				after: { ...after, measured_at: after.measured_at.toISOString() }
			}
		});
		return { ...after, measured_at: after.measured_at.toISOString() };
	});
}

export interface BenchLot {
	id: string;
	lot_code: string;
	po_number: string;
	status: 'awaiting_arrival' | 'in_inspection' | 'pending_decision';
	supplier_name: string;
	part_number: string;
	part_description: string;
	chemistry: string;
	cells_in_series: number;
	quantity: number;
	aql: number;
	inspection_level: string;
	severity: string | null;
	expected_arrival: string | null;
	received_at: string | null;
	created_at: string;
	/** Distinct serials measured so far. */
	units_measured: number;
}

/** Lots for the receiving bench: awaiting arrival, on the bench or awaiting their decision, oldest first. */
export async function benchLots(db: Database): Promise<BenchLot[]> {
	const result = await db.execute<BenchLot & Record<string, unknown>>(sql`
		select l.id, l.lot_code, l.po_number, l.status::text as status, o.name as supplier_name, p.part_number,
		       p.description as part_description, p.chemistry, p.cells_in_series, l.quantity, p.aql, p.inspection_level,
		       l.severity::text as severity, l.expected_arrival::text as expected_arrival,
		       l.received_at, l.created_at,
		       (select count(distinct r.serial) from readings r where r.lot_id = l.id)::int as units_measured
		from lots l join parts p on p.id = l.part_id join organisations o on o.id = l.supplier_id
		where l.status in ('awaiting_arrival', 'in_inspection', 'pending_decision')
		order by coalesce(l.received_at, l.created_at), l.id
		limit 500`);
	const iso = (d: unknown) => (d instanceof Date ? d.toISOString() : d === null ? null : String(d));
	return result.rows.map((r) => ({ ...r, aql: Number(r.aql), received_at: iso(r.received_at), created_at: iso(r.created_at) ?? '' }));
}
