/**
 * Concurrency (issue 8): two inspectors save readings to one lot at the same time, 20 batches each
 * with distinct serials, all in flight together → every batch is stored (none lost), the first
 * batch alone records the arrival, and the lot ends in inspection.
 * Two simultaneous quality overrides of one lot (one wins, the other gets 409) are covered by
 * tests/integration/outbox-faults.test.ts ("lets exactly one of two simultaneous overrides win");
 * not repeated here.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startApp, type RunningApp } from '../helpers/app';
import { tokenFor } from '../helpers/auth';
import { freshDatabase, withClient } from '../helpers/db';
import { call, createLot, modelReadings, type Caller } from './readings-fixtures';

const BATCHES_EACH = 20;
const PER_BATCH = 25;
let app: RunningApp;
let db: Awaited<ReturnType<typeof freshDatabase>>;

beforeAll(async () => {
	db = await freshDatabase('concurrency');
	app = await startApp({ databaseUrl: db.url });
}, 60_000);

afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

describe('two inspectors saving readings to one lot at once', () => {
	it('stores every batch of both, records the arrival and the completed sample once each', async () => {
		const buyer: Caller = { base: app.url, token: await tokenFor(db.url, 'buyer@kestrel-mobility.example') };
		const first: Caller = { base: app.url, token: await tokenFor(db.url, 'inspector@kestrel-mobility.example') };
		const second: Caller = { base: app.url, token: await tokenFor(db.url, 'inspector2@kestrel-mobility.example') };
		const lot = await createLot(buyer, { partNumber: 'VC-21700-50G', quantity: 5000, declaredSoc: 0.3 });

		const batch = (who: Caller, tag: string, i: number) =>
			call(who, `/api/v1/lots/${lot.id}/readings`, {
				body: { readings: modelReadings('NMC', PER_BATCH, 0.3, { prefix: `${tag}${String(i).padStart(2, '0')}` }) }
			});
		const results = await Promise.all(Array.from({ length: BATCHES_EACH }, (_, i) => [batch(first, 'A', i), batch(second, 'B', i)]).flat());

		expect(results.map((r) => r.status)).toEqual(Array(2 * BATCHES_EACH).fill(201));
		expect(results.reduce((sum, r) => sum + r.json.inserted, 0)).toBe(2 * BATCHES_EACH * PER_BATCH);
		expect(results.filter((r) => r.json.arrived)).toHaveLength(1);
		// 1,000 units exceed the plan's sample (lot 5,000 → letter L), so the lot ends awaiting its decision.
		expect(results.every((r) => ['in_inspection', 'pending_decision'].includes(r.json.lot_status))).toBe(true);

		const state = await withClient(db.url, async (c) => ({
			readings: Number((await c.query('select count(*) as n from readings where lot_id = $1', [lot.id])).rows[0].n),
			serials: Number((await c.query('select count(distinct serial) as n from readings where lot_id = $1', [lot.id])).rows[0].n),
			byInspector: (
				await c.query(
					`select u.email, count(*)::int as n from readings r join "user" u on u.id = r.entered_by where r.lot_id = $1 group by u.email order by u.email`,
					[lot.id]
				)
			).rows,
			status: (await c.query('select status::text as s, received_at from lots where id = $1', [lot.id])).rows[0],
			arrivals: Number(
				(await c.query(`select count(*) as n from audit_events where lot_id = $1 and action = 'lot.arrival'`, [lot.id])).rows[0].n
			),
			completions: Number(
				(await c.query(`select count(*) as n from audit_events where lot_id = $1 and action = 'lot.sample_complete'`, [lot.id])).rows[0].n
			)
		}));
		expect(state.readings).toBe(2 * BATCHES_EACH * PER_BATCH);
		expect(state.serials).toBe(2 * BATCHES_EACH * PER_BATCH);
		expect(state.byInspector).toEqual([
			{ email: 'inspector2@kestrel-mobility.example', n: BATCHES_EACH * PER_BATCH },
			{ email: 'inspector@kestrel-mobility.example', n: BATCHES_EACH * PER_BATCH }
		]);
		expect(state.status.s).toBe('pending_decision');
		expect(state.status.received_at).not.toBeNull();
		expect(state.arrivals).toBe(1);
		expect(state.completions).toBe(1);

		// What the API serves agrees with the table.
		const listed = await call(first, `/api/v1/lots/${lot.id}/readings`);
		expect(listed.json.count).toBe(2 * BATCHES_EACH * PER_BATCH);
	});
});
