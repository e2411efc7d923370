/**
 * The lot list at scale (500,000 lots by default) through listLots — the service of the /lots page
 * and GET /api/v1/lots — in-process on the same pg pool, against the bare indexed query that gives
 * the same rows (the buyer's first page of 50, newest first: lots with their supplier's name and
 * part's facts, the page size + 1 that tells whether a next page exists), written by hand. The SQL
 * listLots issues is captured with a drizzle logger and its EXPLAIN ANALYZE is printed.
 */
import { drizzle } from 'drizzle-orm/node-postgres';
import { getPool, schema } from '$lib/server/db';
import { listLots, type LotListFilter } from '$lib/server/services/lots';
import { findUserByEmail, toSessionUser } from '$lib/server/services/users';
import type { SessionUser } from '$lib/roles';
import { SCALE_LOTS, sizeLabel } from '../lib/data';
import { interleaved, timeMs, type BenchLine } from '../lib/measure';

const PAGE = 50;
const BARE_ROWS = `select l.*, o.name as supplier_name, p.part_number, p.description, p.chemistry, p.cells_in_series,
	p.cells_in_parallel, p.nominal_capacity_ah, l.created_at::text as cursor_at
	from lots l join organisations o on o.id = l.supplier_id join parts p on p.id = l.part_id`;
const NEWEST_FIRST = `order by l.created_at desc, l.id desc limit ${PAGE + 1}`;
const CALLS_PER_SAMPLE = 20; // single calls take about a millisecond: time batches

export interface ListResult {
	line: BenchLine;
	explain: string;
	/** The plan reads the index it should, and scans no table whole. */
	usesIndex: boolean;
}

/** The demo buyer, who sees every lot. */
export async function benchBuyer(): Promise<SessionUser> {
	const row = await findUserByEmail('buyer@kestrel-mobility.example');
	if (!row) throw new Error('the demo buyer is not seeded');
	return toSessionUser(row);
}

/** EXPLAIN ANALYZE of the statement listLots sends for this filter. */
async function explainListLots(user: SessionUser, filter: LotListFilter): Promise<string> {
	const pool = getPool();
	const captured: Array<{ query: string; params: unknown[] }> = [];
	const logged = drizzle(pool, { schema, logger: { logQuery: (query, params) => captured.push({ query, params }) } });
	await listLots(logged, user, filter);
	const statement = captured.at(-1)!;
	const plan = await pool.query(`explain (analyze, costs off, timing off, summary off) ${statement.query}`, statement.params);
	return plan.rows.map((r: Record<string, string>) => r['QUERY PLAN']).join('\n');
}

/** Mean ms per call over a batch, op and floor interleaved. */
export async function compareBatches(op: () => Promise<unknown>, floor: () => Promise<unknown>) {
	const batch = (fn: () => Promise<unknown>) => async () =>
		(await timeMs(async () => {
			for (let i = 0; i < CALLS_PER_SAMPLE; i++) await fn();
		})) / CALLS_PER_SAMPLE;
	return interleaved(batch(op), batch(floor), { warmup: 3, rounds: 21 });
}

export async function benchLotList(): Promise<ListResult> {
	const user = await benchBuyer();
	const pool = getPool();
	const db = drizzle(pool, { schema });
	const first = await listLots(db, user, { limit: PAGE });
	if (first.lots.length !== PAGE) throw new Error(`listLots returned ${first.lots.length} lots, expected ${PAGE}`);
	const explain = await explainListLots(user, { limit: PAGE });
	const result = await compareBatches(
		() => listLots(db, user, { limit: PAGE }),
		() => pool.query(`${BARE_ROWS} ${NEWEST_FIRST}`)
	);
	return {
		line: { name: `lot-list-${sizeLabel(SCALE_LOTS)}`, value: result.op, floor: result.floor, unit: 'ms', target: { op: '<=', value: 2 } },
		explain,
		usesIndex: /Index (Only )?Scan/.test(explain) && !/Seq Scan on lots/.test(explain)
	};
}
