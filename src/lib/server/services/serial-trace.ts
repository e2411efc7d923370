/**
 * Serial trace: every reading of one unit (exact serial) or of serials starting with a prefix,
 * across the lots the person may see, with the lot, supplier, part, the unit's flags and the lot's
 * latest decision. A field failure starts here: which lot held this cell, what did it read at
 * receiving, who decided. The exact search uses readings_serial_idx (serial, lot_id); the prefix
 * search reads a range of the same index (serial >= prefix and < prefix + U+10FFFF) and keeps the
 * true prefixes with starts_with. The range holds every serial that starts with the prefix in a
 * code-point collation, which is what our clusters use (initdb --locale=C.UTF-8, scripts/lib/pg.mjs).
 */
import { and, asc, eq, sql, type SQL } from 'drizzle-orm';
import type { Database } from '../db';
import { decisions, evaluations, lots, organisations, parts, readings, users } from '../db/schema';
import type { SessionUser } from '$lib/roles';
import type { TraceQuery } from '$lib/schemas/trace';

export interface TracedReading {
	reading_id: number;
	serial: string;
	ocv_v: number;
	temperature_c: number;
	ac_resistance_mohm: number | null;
	measured_at: string;
	source: string;
	lot_id: string;
	lot_code: string;
	lot_status: string;
	supplier_id: string;
	supplier_name: string;
	part_id: string;
	part_number: string;
	/** The unit's flags in the evaluation behind the lot's latest decision; null while the lot is undecided. */
	flags: string[] | null;
	decision: { kind: string; to_status: string; decided_at: string; decided_by: string | null } | null;
}

const latestDecision = sql`(select d.id from ${decisions} d where d.lot_id = ${lots.id} order by d.decided_at desc limit 1)`;

/** The unit's flags inside the decided evaluation's stored result. */
const unitFlags = sql<
	string[] | null
>`(select u->'unit_flags' from jsonb_array_elements(${evaluations.result}->'units') u where u->>'serial' = ${readings.serial} limit 1)`;

function serialMatch(query: TraceQuery): SQL {
	if (query.serial !== undefined) return eq(readings.serial, query.serial);
	const prefix = query.serial_prefix!;
	return sql`${readings.serial} >= ${prefix} and ${readings.serial} < ${prefix + '\u{10FFFF}'} and starts_with(${readings.serial}, ${prefix})`;
}

export async function traceSerial(
	db: Database,
	user: SessionUser,
	query: TraceQuery
): Promise<{ readings: TracedReading[]; truncated: boolean }> {
	const ownOnly = user.role === 'supplier' ? eq(lots.supplierId, user.organisationId ?? '00000000-0000-0000-0000-000000000000') : undefined;
	const rows = await db
		.select({
			r: readings,
			lotCode: lots.lotCode,
			lotStatus: lots.status,
			supplierId: lots.supplierId,
			supplierName: organisations.name,
			partId: lots.partId,
			partNumber: parts.partNumber,
			flags: unitFlags,
			decisionKind: decisions.kind,
			decisionTo: decisions.toStatus,
			decidedAt: decisions.decidedAt,
			decidedBy: users.email
		})
		.from(readings)
		.innerJoin(lots, eq(lots.id, readings.lotId))
		.innerJoin(organisations, eq(organisations.id, lots.supplierId))
		.innerJoin(parts, eq(parts.id, lots.partId))
		.leftJoin(decisions, eq(decisions.id, latestDecision))
		.leftJoin(evaluations, eq(evaluations.id, decisions.evaluationId))
		.leftJoin(users, eq(users.id, decisions.decidedBy))
		.where(and(serialMatch(query), ownOnly))
		.orderBy(asc(readings.serial), asc(readings.measuredAt), asc(readings.id))
		.limit(query.limit + 1);
	return {
		truncated: rows.length > query.limit,
		readings: rows.slice(0, query.limit).map((row) => ({
			reading_id: row.r.id,
			serial: row.r.serial,
			ocv_v: row.r.ocvV,
			temperature_c: row.r.temperatureC,
			ac_resistance_mohm: row.r.acResistanceMohm,
			measured_at: row.r.measuredAt.toISOString(),
			source: row.r.source,
			lot_id: row.r.lotId,
			lot_code: row.lotCode,
			lot_status: row.lotStatus,
			supplier_id: row.supplierId,
			supplier_name: row.supplierName,
			part_id: row.partId,
			part_number: row.partNumber,
			flags: row.flags,
			decision:
				row.decisionKind && row.decisionTo && row.decidedAt
					? { kind: row.decisionKind, to_status: row.decisionTo, decided_at: row.decidedAt.toISOString(), decided_by: row.decidedBy }
					: null
		}))
	};
}
