/**
 * The foundation's promises: migrations apply once, the audit trail is append-only in the database
 * itself, the demo seed is idempotent, the start scripts reuse a running cluster, and the health
 * endpoint really asks PostgreSQL.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { join, resolve } from 'node:path';
import { freshDatabase, withClient } from '../helpers/db';
import { startApp, type RunningApp } from '../helpers/app';
import { testEnv } from '../helpers/env';
import { ensurePostgres } from '../../scripts/lib/pg.mjs';
import { migrateDatabase } from '../../scripts/lib/migrate.mjs';

const root = resolve(import.meta.dirname, '../..');
let db: Awaited<ReturnType<typeof freshDatabase>>;

beforeAll(async () => {
	db = await freshDatabase('foundation');
});
afterAll(async () => {
	await db.drop();
});

const countRows = (table: string) =>
	withClient(db.url, async (c) => Number((await c.query(`select count(*)::int as n from ${table}`)).rows[0].n));

describe('audit trail', () => {
	it('accepts inserts but refuses UPDATE, DELETE and TRUNCATE', async () => {
		await withClient(db.url, async (c) => {
			await c.query(`insert into audit_events (action, details) values ('test.append', '{}')`);
			await expect(c.query(`update audit_events set action = 'changed'`)).rejects.toThrow(/append-only/);
			await expect(c.query(`delete from audit_events`)).rejects.toThrow(/append-only/);
			await expect(c.query(`truncate audit_events`)).rejects.toThrow(/append-only/);
			const { rows } = await c.query(`select count(*)::int as n from audit_events where action = 'test.append'`);
			expect(rows[0].n).toBe(1);
		});
	});
});

describe('migrations and seed', () => {
	it('a second migration run changes nothing', async () => {
		const before = await countRows('drizzle.__drizzle_migrations');
		await migrateDatabase(db.ownerUrl, root);
		expect(await countRows('drizzle.__drizzle_migrations')).toBe(before);
		expect(before).toBeGreaterThanOrEqual(2);
	});

	it('seeding twice leaves every table as it was', async () => {
		const tables = ['organisations', '"user"', 'supplier_contacts', 'parts', 'ocv_models', 'lots', 'readings', 'documents'];
		const before = await Promise.all(tables.map(countRows));
		const res = spawnSync('npx', ['tsx', 'seed/index.ts'], { cwd: root, env: { ...process.env, DATABASE_URL: db.url }, encoding: 'utf8' });
		expect(res.status, res.stderr).toBe(0);
		expect(await Promise.all(tables.map(countRows))).toEqual(before);
		expect(before[0]).toBeGreaterThanOrEqual(5); // own company + four suppliers
	});

	it('dates each demo lot’s history in its invented past: registration, bench, decision, in order', async () => {
		await withClient(db.url, async (c) => {
			const { rows } = await c.query(`
				select l.lot_code, l.created_at, l.received_at, l.decided_at,
					array_agg(e.action order by e.at, e.id) as by_time, array_agg(e.action order by e.id) as by_insert,
					min(e.at) as first_at, max(e.at) filter (where e.action = 'lot.arrival') as arrival_at,
					max(e.at) filter (where e.action = 'lot.decided') as decided_event_at
				from lots l join audit_events e on e.lot_id = l.id
				group by l.id`);
			expect(rows.length).toBeGreaterThanOrEqual(25);
			const hours = (a: Date, b: Date) => Math.abs(a.getTime() - b.getTime()) / 3_600_000;
			for (const lot of rows) {
				expect(lot.by_time, lot.lot_code).toEqual(lot.by_insert);
				expect(hours(lot.first_at, lot.created_at), lot.lot_code).toBeLessThan(1);
				if (lot.arrival_at) expect(hours(lot.arrival_at, lot.received_at), lot.lot_code).toBeLessThan(1);
				if (lot.decided_event_at) expect(hours(lot.decided_event_at, lot.decided_at), lot.lot_code).toBeLessThan(1);
			}
			// The demo spans weeks, not the seconds the seed took.
			const spread = rows.map((r) => r.first_at.getTime());
			expect((Math.max(...spread) - Math.min(...spread)) / 86_400_000).toBeGreaterThan(14);
		});
	});

	it('refuses to seed demo passwords in production', () => {
		const res = spawnSync('npx', ['tsx', 'seed/index.ts'], {
			cwd: root,
			env: { ...process.env, DATABASE_URL: db.url, NODE_ENV: 'production' },
			encoding: 'utf8'
		});
		expect(res.status).not.toBe(0);
		expect(res.stderr).toMatch(/refusing/);
	});
});

describe('local PostgreSQL', () => {
	it('reuses a running cluster instead of starting a second one', async () => {
		const dataDir = join(testEnv().scratch, 'reuse-check', 'pg');
		const first = await ensurePostgres({ dataDir, preferredPort: 45400, throwaway: true, log: () => {} });
		try {
			const second = await ensurePostgres({ dataDir, preferredPort: 45500, throwaway: true, log: () => {} });
			expect(second.reused).toBe(true);
			expect(second.port).toBe(first.port);
			await withClient(`${second.url}/postgres`, async (c) => expect((await c.query('select 1 as one')).rows[0].one).toBe(1));
		} finally {
			await first.stop();
		}
	});
});

describe('health endpoint', () => {
	let app: RunningApp;
	beforeAll(async () => {
		app = await startApp({ databaseUrl: db.url });
	});
	afterAll(async () => {
		await app?.stop();
	});

	it('answers ok when the database answers', async () => {
		const res = await fetch(`${app.url}/api/v1/health`);
		expect(res.status).toBe(200);
		expect(await res.json()).toEqual({ status: 'ok', db: 'ok' });
	});

	it('sends the security headers', async () => {
		const res = await fetch(`${app.url}/signin`);
		expect(res.headers.get('x-content-type-options')).toBe('nosniff');
		expect(res.headers.get('referrer-policy')).toBe('strict-origin-when-cross-origin');
		expect(res.headers.get('content-security-policy') ?? '').toContain("frame-ancestors 'none'");
	});
});
