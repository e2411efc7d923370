/**
 * A supplier's scorecard at scale: supplierScorecard — the service of the scorecard page and
 * GET /api/v1/suppliers/{id}/scorecard — for the bench part's supplier, in-process on the same pool,
 * vs. the bare aggregate: one SQL statement that counts the same lots per part and month (received,
 * original disposition from the first automatic decision, units and nonconforming units of the
 * latest evaluation).
 */
import { getDb, getPool } from '$lib/server/db';
import { supplierScorecard } from '$lib/server/services/scorecards';
import type { BenchContext } from '../lib/context';
import { SCALE_LOTS, sizeLabel } from '../lib/data';
import { interleaved, timeMs, type BenchLine } from '../lib/measure';

const BARE_AGGREGATE = `
	select l.part_id, to_char(date_trunc('month', coalesce(l.decided_at, l.received_at, l.created_at)), 'YYYY-MM') as month,
		count(*) as received,
		count(*) filter (where o.disposition = 'accepted') as accepted,
		count(*) filter (where o.disposition = 'on_hold') as held,
		count(*) filter (where o.disposition = 'rejected') as rejected,
		coalesce(sum(jsonb_array_length(coalesce(e.result->'units', '[]'::jsonb))) filter (where o.disposition is not null), 0) as units,
		coalesce(sum((e.result->>'nonconforming')::int) filter (where o.disposition is not null), 0) as nonconforming
	from lots l
	left join lateral (select d.to_status::text as first from decisions d where d.lot_id = l.id and d.kind = 'automatic' order by d.decided_at limit 1) d on true
	left join lateral (select result from evaluations where lot_id = l.id order by id desc limit 1) e on true
	cross join lateral (select coalesce(d.first, case when l.status in ('accepted', 'on_hold', 'rejected') then l.status::text end) as disposition) o
	where l.supplier_id = $1 and l.status in ('in_inspection', 'pending_decision', 'accepted', 'on_hold', 'rejected')
	group by 1, 2`;

export async function benchScorecard(ctx: BenchContext): Promise<BenchLine> {
	const supplierId = ctx.part.supplierId;
	const db = getDb();
	const pool = getPool();
	const card = await supplierScorecard(db, supplierId);
	const { rows } = await pool.query<{ received: string }>(BARE_AGGREGATE, [supplierId]);
	const received = rows.reduce((n, r) => n + Number(r.received), 0);
	if (card.totals.lotsReceived !== received)
		throw new Error(`the scorecard counts ${card.totals.lotsReceived} lots received, the aggregate ${received}`);
	const result = await interleaved(
		() => timeMs(() => supplierScorecard(db, supplierId)),
		() => timeMs(() => pool.query(BARE_AGGREGATE, [supplierId])),
		{ warmup: 1, rounds: 7 }
	);
	return { name: `scorecard-${sizeLabel(SCALE_LOTS)}`, value: result.op, floor: result.floor, unit: 'ms', target: { op: '<=', value: 3 } };
}
