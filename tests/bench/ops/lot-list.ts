/**
 * (5) The lot list at scale (50,000 lots, 1,000,000 readings): listLots — the service the /lots
 * page load calls — for a buyer, first page of 50, in-process on the same pg pool, vs. a bare
 * `SELECT * FROM lots ORDER BY created_at DESC LIMIT 50`. The SQL listLots issues is captured with
 * a drizzle logger and its EXPLAIN ANALYZE is printed, to show the index it uses.
 */
import { drizzle } from 'drizzle-orm/node-postgres';
import { getPool, schema } from '$lib/server/db';
import { listLots } from '$lib/server/services/lots';
import { findUserByEmail, toSessionUser } from '$lib/server/services/users';
import type { BenchContext } from '../lib/context';
import { interleaved, timeMs, type BenchLine } from '../lib/measure';

const PAGE = 50;
const CALLS_PER_SAMPLE = 20; // single calls take well under a millisecond: time batches

export interface LotListResult {
	line: BenchLine;
	explain: string;
	usesIndex: boolean;
}

export async function benchLotList(_ctx: BenchContext): Promise<LotListResult> {
	const buyerRow = await findUserByEmail('buyer@kestrel-mobility.example');
	if (!buyerRow) throw new Error('the demo buyer is not seeded');
	const buyer = toSessionUser(buyerRow);
	const pool = getPool();
	const db = drizzle(pool, { schema });
	const captured: Array<{ query: string; params: unknown[] }> = [];
	const logged = drizzle(pool, { schema, logger: { logQuery: (query, params) => captured.push({ query, params }) } });

	const first = await listLots(logged, buyer, { limit: PAGE });
	if (first.lots.length !== PAGE) throw new Error(`listLots returned ${first.lots.length} lots, expected ${PAGE}`);
	const listSql = captured.at(-1)!;
	const plan = await pool.query(`explain (analyze, costs off, timing off, summary off) ${listSql.query}`, listSql.params);
	const explain = plan.rows.map((r: Record<string, string>) => r['QUERY PLAN']).join('\n');

	const bare = `select * from lots order by created_at desc limit ${PAGE}`;
	const op = () =>
		timeMs(async () => {
			for (let i = 0; i < CALLS_PER_SAMPLE; i++) await listLots(db, buyer, { limit: PAGE });
		}).then((ms) => ms / CALLS_PER_SAMPLE);
	const floor = () =>
		timeMs(async () => {
			for (let i = 0; i < CALLS_PER_SAMPLE; i++) await pool.query(bare);
		}).then((ms) => ms / CALLS_PER_SAMPLE);
	const result = await interleaved(op, floor, { warmup: 3, rounds: 21 });
	return {
		line: { name: 'lot-list-50k', value: result.op, floor: result.floor, unit: 'ms', target: { op: '<=', value: 2 } },
		explain,
		usesIndex: /Index (Only )?Scan/.test(explain) && !/Seq Scan on lots/.test(explain)
	};
}
