/**
 * Least privilege in PostgreSQL (issue 18, item 9): the tables belong to the owner role that runs
 * migrations; the running app connects as a role that cannot change or drop tables, cannot switch
 * the audit trail's triggers off and cannot change or remove audit rows; it can do its job.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { resolve } from 'node:path';
import { APP_ROLE, OWNER_ROLE, ownedDatabase } from '../../scripts/lib/roles.mjs';
import { migrateDatabase } from '../../scripts/lib/migrate.mjs';
import { testEnv } from '../helpers/env';
import { startApp, type RunningApp } from '../helpers/app';
import { tokenFor } from '../helpers/auth';
import { freshDatabase, withClient, type FreshDatabase } from '../helpers/db';

let db: FreshDatabase;
beforeAll(async () => {
	db = await freshDatabase('least_privilege');
});
afterAll(async () => {
	await db?.drop();
});

/** PostgreSQL's SQLSTATE of a statement that fails (or 'ok'). */
async function outcome(url: string, statement: string): Promise<string> {
	return withClient(url, async (c) => {
		try {
			await c.query(statement);
			return 'ok';
		} catch (error) {
			return String((error as { code?: string }).code);
		}
	});
}

const INSUFFICIENT_PRIVILEGE = '42501';

describe('the app role', () => {
	it.each([
		['ALTER TABLE', 'alter table lots add column smuggled text'],
		['DROP TABLE', 'drop table readings'],
		['disable the audit triggers', 'alter table audit_events disable trigger all'],
		['disable one audit trigger', 'alter table audit_events disable trigger audit_events_no_update_delete'],
		['UPDATE audit_events', `update audit_events set action = 'rewritten'`],
		['DELETE FROM audit_events', 'delete from audit_events'],
		['TRUNCATE audit_events', 'truncate audit_events'],
		['TRUNCATE a business table', 'truncate lots cascade'],
		['CREATE TABLE', 'create table smuggled (id int)'],
		['CREATE SCHEMA', 'create schema smuggled'],
		['change the job queue', 'alter table graphile_worker._private_jobs add column smuggled text'],
		['replica mode (skips triggers)', 'set session_replication_role = replica'],
		['CREATE ROLE', 'create role smuggled'],
		['change its own role', `alter role ${APP_ROLE} superuser`]
	])('cannot %s', async (_what, statement) => {
		expect(await outcome(db.appUrl, statement)).toBe(INSUFFICIENT_PRIVILEGE);
	});

	it('can read and append to the audit trail, and write business rows', async () => {
		expect(await outcome(db.appUrl, `insert into audit_events (action, details) values ('test.least_privilege', '{}')`)).toBe('ok');
		expect(await outcome(db.appUrl, 'select count(*) from audit_events')).toBe('ok');
		expect(await outcome(db.appUrl, `update organisations set name = name where false`)).toBe('ok');
		expect(await outcome(db.appUrl, `delete from supplier_contacts where false`)).toBe('ok');
	});

	it('is no superuser and owns nothing; the owner role owns the database and every table', async () => {
		await withClient(db.url, async (c) => {
			const roles = await c.query(
				'select rolname, rolsuper, rolcreaterole, rolcreatedb, rolbypassrls from pg_roles where rolname = any($1) order by rolname',
				[[APP_ROLE, OWNER_ROLE]]
			);
			expect(roles.rows).toEqual([
				{ rolname: APP_ROLE, rolsuper: false, rolcreaterole: false, rolcreatedb: false, rolbypassrls: false },
				{ rolname: OWNER_ROLE, rolsuper: false, rolcreaterole: false, rolcreatedb: false, rolbypassrls: false }
			]);
			const owner = await c.query('select pg_get_userbyid(datdba) as owner from pg_database where datname = current_database()');
			expect(owner.rows[0].owner).toBe(OWNER_ROLE);
			const tables = await c.query(`select distinct tableowner from pg_tables where schemaname in ('public', 'drizzle')`);
			expect(tables.rows).toEqual([{ tableowner: OWNER_ROLE }]);
			const appOwns = await c.query(
				`select count(*)::int as n from pg_class where relowner = (select oid from pg_roles where rolname = $1)`,
				[APP_ROLE]
			);
			expect(appOwns.rows[0].n).toBe(0);
		});
	});
});

describe('the running app', () => {
	let app: RunningApp;
	afterAll(async () => {
		await app?.stop();
	});

	it('connects as the app role and works', async () => {
		app = await startApp({ databaseUrl: db.url });
		const token = await tokenFor(db.url, 'buyer@kestrel-mobility.example');
		const lots = await fetch(`${app.url}/api/v1/lots`, { headers: { authorization: `Bearer ${token}` } });
		expect(lots.status).toBe(200);
		const created = await fetch(`${app.url}/api/v1/lots`, {
			method: 'POST',
			headers: { authorization: `Bearer ${token}`, 'content-type': 'application/json' },
			body: JSON.stringify(await newLotBody())
		});
		expect(created.status, await created.clone().text()).toBe(201);
		const users = await withClient(db.url, async (c) => {
			const { rows } = await c.query(`select distinct usename from pg_stat_activity where datname = $1 and pid <> pg_backend_pid()`, [
				db.name
			]);
			return rows.map((r) => r.usename as string);
		});
		expect(users).toEqual([APP_ROLE]);
	});
});

/** A lot of a seeded lithium-ion part (UN3480 fits it). */
async function newLotBody() {
	return withClient(db.url, async (c) => {
		const { rows } = await c.query(
			`select p.id as part_id, p.supplier_id from parts p where p.chemistry in ('NMC', 'LFP', 'NCA') order by p.part_number limit 1`
		);
		return {
			po_number: 'PO-LEAST-PRIV',
			supplier_id: rows[0].supplier_id,
			part_id: rows[0].part_id,
			quantity: 100,
			declared_soc: 0.3,
			transport: 'road',
			un_number: 'UN3480'
		};
	});
}

describe('a database made before the roles existed (an older npm start cluster)', () => {
	it('is handed over to the owner role, migrates as it, and grants the app role its rights', async () => {
		const { pgUrl } = testEnv();
		const name = `t_handover_${Date.now()}`;
		await withClient(`${pgUrl}/postgres`, (c) => c.query(`create database "${name}"`));
		try {
			// As it was: migrated by the superuser, who owns every table.
			await migrateDatabase(`${pgUrl}/${name}`, resolve(import.meta.dirname, '../..'));
			const urls = await ownedDatabase(pgUrl, name);
			await migrateDatabase(urls.ownerUrl, resolve(import.meta.dirname, '../..'));
			const owners = await withClient(urls.superUrl, async (c) => {
				const { rows } = await c.query(`
					select distinct pg_get_userbyid(relowner) as owner from pg_class c join pg_namespace n on n.oid = c.relnamespace
					where n.nspname in ('public', 'drizzle', 'graphile_worker') and relkind in ('r', 'S', 'v')
					union select distinct pg_get_userbyid(proowner) from pg_proc p join pg_namespace n on n.oid = p.pronamespace where n.nspname in ('public', 'graphile_worker')
					union select pg_get_userbyid(nspowner) from pg_namespace where nspname = 'graphile_worker'
					union select pg_get_userbyid(datdba) from pg_database where datname = current_database()`);
				return rows.map((r) => r.owner as string);
			});
			expect(owners).toEqual([OWNER_ROLE]);
			expect(await outcome(urls.appUrl, `insert into audit_events (action, details) values ('test.handover', '{}')`)).toBe('ok');
			expect(await outcome(urls.appUrl, 'delete from audit_events')).toBe(INSUFFICIENT_PRIVILEGE);
			expect(await outcome(urls.appUrl, 'drop table lots')).toBe(INSUFFICIENT_PRIVILEGE);
			expect(await outcome(urls.appUrl, `select graphile_worker.add_job('test_handover', '{}'::json)`)).toBe('ok');
		} finally {
			await withClient(`${pgUrl}/postgres`, (c) => c.query(`drop database if exists "${name}" with (force)`));
		}
	}, 60_000);
});
