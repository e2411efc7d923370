/**
 * Supplier (and per-part) scorecards from decided lots. A lot's "original" disposition is the
 * engine's first decision (ISO 2859-1 counts original inspection); its final status may differ
 * after a quality review. Nonconforming ppm = nonconforming units / units inspected × 10⁶, from
 * each lot's latest evaluation.
 */
import { and, eq, sql } from 'drizzle-orm';
import type { Database } from '../db';
import { organisations, parts } from '../db/schema';
import { NotFound } from '../errors';
import { nextLotSeverity } from './sampling-state';

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
}

const RECEIVED = ['in_inspection', 'pending_decision', 'accepted', 'on_hold', 'rejected'];

async function lotFacts(db: Database, supplierId: string, partId?: string): Promise<LotFact[]> {
	const result = await db.execute<LotFact>(sql`
		select l.id, l.part_id, l.status::text as status,
		       to_char(date_trunc('month', coalesce(l.decided_at, l.received_at, l.created_at)), 'YYYY-MM') as month,
		       (select d.to_status::text from decisions d where d.lot_id = l.id and d.kind = 'automatic'
		         order by d.decided_at asc limit 1) as original,
		       (e.result->>'nonconforming')::int as nonconforming,
		       jsonb_array_length(coalesce(e.result->'units', '[]'::jsonb)) as units
		from lots l
		left join lateral (select result from evaluations where lot_id = l.id order by id desc limit 1) e on true
		where l.supplier_id = ${supplierId} ${partId ? sql`and l.part_id = ${partId}` : sql``}
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

export async function supplierScorecard(db: Database, supplierId: string, partId?: string): Promise<Scorecard> {
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
	const facts = await lotFacts(db, supplierId, partId);
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
		severity: part ? (perPart[0]?.severity ?? null) : null
	};
}
