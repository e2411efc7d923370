/**
 * Supplier (and per-part) scorecards from decided lots. A lot's "original" disposition is the
 * engine's first decision (ISO 2859-1 counts original inspection); its final status may differ
 * after a quality review. Nonconforming ppm = nonconforming units / units inspected × 10⁶, from
 * each lot's latest evaluation. A period counts a lot by the day it was decided (else received,
 * else registered).
 */
import { and, asc, eq, sql, type SQL } from 'drizzle-orm';
import type { Database } from '../db';
import { organisations, parts } from '../db/schema';
import { NotFound } from '../errors';
import { nextLotSeverity } from './sampling-state';
import type { Period } from '$lib/schemas/scorecard';

interface LotFact extends Record<string, unknown> {
	id: string;
	part_id: string;
	status: string;
	month: string | null;
	original: string | null;
	nonconforming: number | null;
	units: number | null;
}

export interface ScorecardTotals {
	lotsReceived: number;
	lotsDecided: number;
	accepted: number;
	held: number;
	rejected: number;
	releasedAfterHold: number;
	finalRejected: number;
	acceptanceRate: number | null;
	unitsInspected: number;
	nonconformingUnits: number;
	ppm: number | null;
}

export interface ScorecardMonth {
	period: string;
	received: number;
	accepted: number;
	held: number;
	rejected: number;
	ppm: number | null;
}

export interface Scorecard {
	supplier: { id: string; name: string };
	part: { id: string; partNumber: string } | null;
	parts: { id: string; partNumber: string; description: string; severity: string; totals: ScorecardTotals }[];
	totals: ScorecardTotals;
	months: ScorecardMonth[];
	severity: string | null;
	/** The period counted; null for all time. */
	period: Period | null;
}

const RECEIVED = ['in_inspection', 'pending_decision', 'accepted', 'on_hold', 'rejected'];

/** The day a lot counts on: decided, else received, else registered. */
const lotDay = sql`coalesce(l.decided_at, l.received_at, l.created_at)`;

const inPeriod = (period: Period | null | undefined): SQL =>
	period ? sql`and ${lotDay} >= ${period.from.toISOString()} and ${lotDay} < ${period.to.toISOString()}` : sql``;

async function lotFacts(db: Database, where: SQL, period?: Period | null): Promise<LotFact[]> {
	const result = await db.execute<LotFact>(sql`
		select l.id, l.part_id, l.status::text as status,
		       to_char(date_trunc('month', ${lotDay} at time zone 'UTC'), 'YYYY-MM') as month,
		       -- the engine's result on original inspection (a reject waits on hold for quality, but counts as rejected)
		       (select coalesce(case e0.disposition when 'accept' then 'accepted' when 'hold' then 'on_hold' when 'reject' then 'rejected' end,
		                        d.to_status::text)
		         from decisions d left join evaluations e0 on e0.id = d.evaluation_id
		         where d.lot_id = l.id and d.kind = 'automatic'
		         order by d.decided_at asc limit 1) as original,
		       (e.result->>'nonconforming')::int as nonconforming,
		       jsonb_array_length(coalesce(e.result->'units', '[]'::jsonb)) as units
		from lots l
		left join lateral (select result from evaluations where lot_id = l.id order by id desc limit 1) e on true
		where ${where} ${inPeriod(period)}
		  and l.status::text in (${sql.join(
				RECEIVED.map((s) => sql`${s}`),
				sql`, `
			)})`);
	return result.rows;
}

/** Original disposition of a lot: the first automatic decision, else its current status. */
const originalOf = (f: LotFact) => f.original ?? (['accepted', 'on_hold', 'rejected'].includes(f.status) ? f.status : null);

export function totalsOf(facts: LotFact[]): ScorecardTotals {
	const decided = facts.filter((f) => originalOf(f));
	const count = (pred: (f: LotFact) => boolean) => facts.filter(pred).length;
	const units = decided.reduce((s, f) => s + (f.units ?? 0), 0);
	const nc = decided.reduce((s, f) => s + (f.nonconforming ?? 0), 0);
	const accepted = count((f) => originalOf(f) === 'accepted');
	return {
		lotsReceived: facts.length,
		lotsDecided: decided.length,
		accepted,
		held: count((f) => originalOf(f) === 'on_hold'),
		rejected: count((f) => originalOf(f) === 'rejected'),
		releasedAfterHold: count((f) => originalOf(f) === 'on_hold' && f.status === 'accepted'),
		finalRejected: count((f) => f.status === 'rejected'),
		acceptanceRate: decided.length ? accepted / decided.length : null,
		unitsInspected: units,
		nonconformingUnits: nc,
		ppm: units ? (nc / units) * 1e6 : null
	};
}

function monthsOf(facts: LotFact[]): ScorecardMonth[] {
	const byMonth = new Map<string, LotFact[]>();
	for (const f of facts) if (f.month) byMonth.set(f.month, [...(byMonth.get(f.month) ?? []), f]);
	return [...byMonth.keys()].sort().map((period) => {
		const t = totalsOf(byMonth.get(period)!);
		return { period, received: t.lotsReceived, accepted: t.accepted, held: t.held, rejected: t.rejected, ppm: t.ppm };
	});
}

export async function supplierScorecard(
	db: Database,
	supplierId: string,
	partId?: string,
	period: Period | null = null
): Promise<Scorecard> {
	const [supplier] = await db
		.select({ id: organisations.id, name: organisations.name })
		.from(organisations)
		.where(and(eq(organisations.id, supplierId), eq(organisations.kind, 'supplier')));
	if (!supplier) throw new NotFound('supplier');
	const partRows = await db
		.select({ id: parts.id, partNumber: parts.partNumber, description: parts.description })
		.from(parts)
		.where(eq(parts.supplierId, supplierId))
		.orderBy(parts.partNumber);
	const part = partId ? partRows.find((p) => p.id === partId) : undefined;
	if (partId && !part) throw new NotFound('part');
	const facts = await lotFacts(
		db,
		partId ? sql`l.supplier_id = ${supplierId} and l.part_id = ${partId}` : sql`l.supplier_id = ${supplierId}`,
		period
	);
	const perPart = await Promise.all(
		(part ? [part] : partRows).map(async (p) => ({
			...p,
			// The stored switching state (sampling_states), not a replay of the part's whole history.
			severity: (await nextLotSeverity(db, supplierId, p.id)) as string,
			totals: totalsOf(facts.filter((f) => f.part_id === p.id))
		}))
	);
	return {
		supplier,
		part: part ? { id: part.id, partNumber: part.partNumber } : null,
		parts: perPart,
		totals: totalsOf(facts),
		months: monthsOf(facts),
		severity: part ? (perPart[0]?.severity ?? null) : null,
		period
	};
}

export interface ComparisonRow {
	supplier: { id: string; name: string };
	parts: { id: string; partNumber: string }[];
	totals: ScorecardTotals;
}

/**
 * Suppliers side by side for one chemistry or one part number: each supplier's parts that match,
 * with the same totals as its scorecard, over the same period. Suppliers without a matching part
 * are left out; a matching supplier without lots in the period shows zeros and no rates.
 */
export async function compareSuppliers(
	db: Database,
	match: { chemistry?: string; partNumber?: string },
	period: Period | null = null
): Promise<ComparisonRow[]> {
	const conditions = [eq(organisations.kind, 'supplier')];
	if (match.chemistry) conditions.push(eq(parts.chemistry, match.chemistry));
	if (match.partNumber) conditions.push(eq(parts.partNumber, match.partNumber));
	const matching = await db
		.select({ id: parts.id, partNumber: parts.partNumber, supplierId: organisations.id, supplierName: organisations.name })
		.from(parts)
		.innerJoin(organisations, eq(organisations.id, parts.supplierId))
		.where(and(...conditions))
		.orderBy(asc(organisations.name), asc(parts.partNumber));
	if (matching.length === 0) return [];
	const partIds = matching.map((p) => p.id);
	const facts = await lotFacts(
		db,
		sql`l.part_id in (${sql.join(
			partIds.map((id) => sql`${id}`),
			sql`, `
		)})`,
		period
	);
	const bySupplier = new Map<string, ComparisonRow>();
	for (const p of matching) {
		const row = bySupplier.get(p.supplierId) ?? { supplier: { id: p.supplierId, name: p.supplierName }, parts: [], totals: totalsOf([]) };
		row.parts.push({ id: p.id, partNumber: p.partNumber });
		bySupplier.set(p.supplierId, row);
	}
	return [...bySupplier.values()].map((row) => {
		const ids = new Set(row.parts.map((p) => p.id));
		return { ...row, totals: totalsOf(facts.filter((f) => ids.has(f.part_id))) };
	});
}
