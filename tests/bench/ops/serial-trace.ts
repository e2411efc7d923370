/**
 * A serial trace at scale (10 million readings by default): traceSerial — the service of
 * GET /api/v1/readings?serial= and the /trace page — in-process on the same pg pool, for the demo
 * buyer, against the bare indexed SQL that gives the same rows (the unit's readings with their lot,
 * supplier, part, the unit's flags in the decided evaluation and the lot's latest decision),
 * written by hand. 97 serials spread across the data set; the SQL traceSerial sends is captured
 * with a drizzle logger and its EXPLAIN ANALYZE is printed.
 */
import { drizzle } from 'drizzle-orm/node-postgres';
import { getPool, schema } from '$lib/server/db';
import { traceSerial } from '$lib/server/services/serial-trace';
import type { TraceQuery } from '$lib/schemas/trace';
import { READINGS_PER_SCALE_LOT, SCALE_LOTS, scaleSerial, sizeLabel } from '../lib/data';
import { benchBuyer, compareBatches, type ListResult } from './lot-list';

const LIMIT = 100; // the API's default page
const BARE_TRACE = `select r.id, r.serial, o.name, p.part_number, d.kind, u.email,
	(select x->'unit_flags' from jsonb_array_elements(e.result->'units') x where x->>'serial' = r.serial limit 1) as flags
	from readings r
	join lots l on l.id = r.lot_id
	join organisations o on o.id = l.supplier_id
	join parts p on p.id = l.part_id
	left join decisions d on d.id = (select d2.id from decisions d2 where d2.lot_id = l.id order by d2.decided_at desc limit 1)
	left join evaluations e on e.id = d.evaluation_id
	left join "user" u on u.id = d.decided_by
	where r.serial = $1
	order by r.serial, r.measured_at, r.id
	limit ${LIMIT + 1}`;

/** EXPLAIN ANALYZE of the statement traceSerial sends for this query. */
async function explainTrace(query: TraceQuery): Promise<string> {
	const pool = getPool();
	const captured: Array<{ query: string; params: unknown[] }> = [];
	const logged = drizzle(pool, { schema, logger: { logQuery: (text, params) => captured.push({ query: text, params }) } });
	await traceSerial(logged, await benchBuyer(), query);
	const statement = captured.at(-1)!;
	const plan = await pool.query(`explain (analyze, costs off, timing off, summary off) ${statement.query}`, statement.params);
	return plan.rows.map((r: Record<string, string>) => r['QUERY PLAN']).join('\n');
}

export async function benchSerialTrace(): Promise<ListResult> {
	const user = await benchBuyer();
	const pool = getPool();
	const db = drizzle(pool, { schema });
	// 97 units spread over the whole data set (a prime step, so they fall on different lots and readings).
	const serials = Array.from({ length: 97 }, (_, k) => scaleSerial(1 + ((k * 5003) % SCALE_LOTS), 1 + (k % READINGS_PER_SCALE_LOT)));
	const serialAt = (i: number) => serials[i % serials.length];
	const query = (serial: string): TraceQuery => ({ serial, serial_prefix: undefined, limit: LIMIT });
	for (const serial of serials.slice(0, 5)) {
		const traced = await traceSerial(db, user, query(serial));
		const bare = await pool.query(BARE_TRACE, [serial]);
		const ids = traced.readings.map((r) => String(r.reading_id)).join();
		if (traced.readings.length !== 1 || ids !== bare.rows.map((r) => String(r.id)).join()) {
			throw new Error(`the trace of ${serial} found readings [${ids}], the bare query other rows or none`);
		}
	}
	const explain = await explainTrace(query(serials[0]));
	let call = 0;
	const result = await compareBatches(
		() => traceSerial(db, user, query(serialAt(call++))),
		() => pool.query(BARE_TRACE, [serialAt(call++)])
	);
	return {
		line: {
			name: `serial-trace-${sizeLabel(SCALE_LOTS * READINGS_PER_SCALE_LOT)}`,
			value: result.op,
			floor: result.floor,
			unit: 'ms',
			target: { op: '<=', value: 2 }
		},
		explain,
		usesIndex: /readings_serial_idx/.test(explain) && !/Seq Scan on (readings|lots)/.test(explain)
	};
}
