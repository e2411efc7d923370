/**
 * PostgreSQL restarted in the middle of a 10,000-row meter-file import (issue 8, "faults"):
 * the import reports failure, leaves no partial lot (no readings, no reading_imports row, the lot
 * still awaiting arrival), the app reconnects by itself, and the same file then imports completely.
 *
 * Deterministic timing: a test connection holds `LOCK TABLE readings IN ACCESS EXCLUSIVE MODE`, so
 * the import's transaction (its reading_imports row and the lot's arrival already written) blocks
 * on its INSERT into readings; the test waits until the server shows that backend waiting on the
 * lock, then restarts the cluster (fast shutdown terminates the blocked backend mid-transaction).
 * This restarts the SHARED test cluster; integration files run one after another, never alongside.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import pg from 'pg';
import { restartPostgres } from '../../scripts/lib/pg.mjs';
import { startApp, type RunningApp } from '../helpers/app';
import { tokenFor } from '../helpers/auth';
import { freshDatabase, withClient } from '../helpers/db';
import { testEnv } from '../helpers/env';
import { waitUntil } from './decisions-fixtures';
import { call, createLot, modelReadings, type Caller } from './readings-fixtures';

const ROWS = 10_000;
let app: RunningApp;
let db: Awaited<ReturnType<typeof freshDatabase>>;

beforeAll(async () => {
	db = await freshDatabase('faults_import');
	app = await startApp({ databaseUrl: db.url });
}, 60_000);

afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

/** A meter file of 10,000 NMC cells at 30 % SOC (the library model's forward curve). */
function meterCsv(): string {
	const rows = modelReadings('NMC', ROWS, 0.3, { prefix: 'PGR', halfWidth: 0.02 });
	return ['serial,ocv_v,temp_c', ...rows.map((r) => `${r.serial},${r.ocv_v},${r.temperature_c}`)].join('\n');
}

function importForm(csv: string): FormData {
	const form = new FormData();
	form.set('file', new Blob([csv], { type: 'text/csv' }), 'meter-10k.csv');
	form.set('mapping', JSON.stringify({ serial: 0, ocv: 1, temperature: 2, first_row: 1 }));
	return form;
}

const lotState = (lotId: string) =>
	withClient(db.url, async (c) => ({
		readings: Number((await c.query('select count(*) as n from readings where lot_id = $1', [lotId])).rows[0].n),
		imports: Number((await c.query('select count(*) as n from reading_imports where lot_id = $1', [lotId])).rows[0].n),
		status: (await c.query('select status::text as s from lots where id = $1', [lotId])).rows[0].s as string
	}));

/** Wait until a backend of the test database waits on a lock while inserting readings. */
async function importBlockedOnLock(): Promise<void> {
	await waitUntil(
		() =>
			withClient(`${testEnv().pgUrl}/postgres`, async (c) => {
				const { rows } = await c.query(
					`select 1 from pg_stat_activity where datname = $1 and wait_event_type = 'Lock' and query ilike '%insert into readings%'`,
					[db.name]
				);
				return rows.length > 0;
			}),
		30_000,
		'the import to block on the readings lock'
	);
}

describe('PostgreSQL restart during a 10,000-row import', () => {
	it('fails the import without partial rows, reconnects, and the same file then imports in full', async () => {
		const env = testEnv();
		const buyer: Caller = { base: app.url, token: await tokenFor(db.url, 'buyer@kestrel-mobility.example') };
		const inspector: Caller = { base: app.url, token: await tokenFor(db.url, 'inspector@kestrel-mobility.example') };
		const lot = await createLot(buyer, { partNumber: 'VC-21700-50G', quantity: 50_000, declaredSoc: 0.3 });
		const csv = meterCsv();
		expect((await lotState(lot.id)).status).toBe('awaiting_arrival');

		// Hold the readings table so the import stops inside its transaction.
		const locker = new pg.Client({ connectionString: db.url });
		locker.on('error', () => {}); // the restart kills this connection too
		await locker.connect();
		await locker.query('begin');
		await locker.query('lock table readings in access exclusive mode');
		const pending = call(inspector, `/api/v1/lots/${lot.id}/imports`, { form: importForm(csv) });
		await importBlockedOnLock();
		restartPostgres({ bin: env.pgBin, dataDir: env.pgData });
		await locker.end().catch(() => {});

		const failed = await pending.catch((e: Error) => {
			throw new Error(
				`the app did not answer the import (${e.message}); exit ${app.process.exitCode ?? app.process.signalCode}; log: ${app
					.output()
					.split('\n')
					.filter((l) => /rror|^\s+at |Emitted|throw/.test(l))
					.slice(0, 30)
					.join('\n')}`
			);
		});
		// A retryable "database unavailable", in the API's error shape.
		expect(failed.status, JSON.stringify(failed.json)).toBe(503);
		expect(failed.json.error).toMatchObject({ code: 'database_unavailable', message: expect.any(String) });
		// Nothing of the import survived: no readings, no import row, no arrival.
		expect(await lotState(lot.id)).toEqual({ readings: 0, imports: 0, status: 'awaiting_arrival' });

		// The app reconnects by itself (its pool drops the dead connections).
		await waitUntil(async () => (await fetch(`${app.url}/api/v1/health`)).status === 200, 30_000, 'the app to reach the database again');
		const again = await call(inspector, `/api/v1/lots/${lot.id}/imports`, { form: importForm(csv) });
		expect(again.status, JSON.stringify(again.json).slice(0, 500)).toBe(201);
		// 10,000 units complete the sample (lot 50,000 → letter N), so the lot awaits its decision.
		expect(again.json).toMatchObject({ inserted: ROWS, already_imported_at: null, lot_status: 'pending_decision' });
		expect(await lotState(lot.id)).toEqual({ readings: ROWS, imports: 1, status: 'pending_decision' });
	}, 120_000);
});
