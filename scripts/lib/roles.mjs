// Least privilege in PostgreSQL: two roles per cluster.
//  - OWNER_ROLE owns the database and every table; migrations and the demo seed run as it.
//  - APP_ROLE is what the running app connects as: it reads and writes rows, but cannot create,
//    alter, drop or truncate tables, cannot disable triggers (only an owner can), and may only read
//    and append to the tables listed in APPEND_ONLY_TABLES (the audit trail).
// The local clusters trust 127.0.0.1 (initdb --auth=trust), so the roles have no passwords.

export const OWNER_ROLE = 'restvolt_owner';
export const APP_ROLE = 'restvolt_app';

/** Tables the app may only read and insert into (no UPDATE, DELETE, TRUNCATE). */
export const APPEND_ONLY_TABLES = ['audit_events'];

/** The same connection URL, signed in as another role (no password: the local clusters trust 127.0.0.1). */
export function urlAs(url, role) {
	const u = new URL(url);
	u.username = role;
	u.password = '';
	return u.toString();
}

const ident = (s) => `"${s.replaceAll('"', '""')}"`;

async function withClient(url, fn) {
	const { default: pg } = await import('pg');
	const client = new pg.Client({ connectionString: url, options: '-c client_min_messages=warning' });
	await client.connect();
	try {
		return await fn(client);
	} finally {
		await client.end();
	}
}

/** Create both roles in the cluster when missing. `serverUrl` is a superuser URL without a database. */
export async function ensureRoles(serverUrl) {
	await withClient(`${serverUrl}/postgres`, async (client) => {
		for (const role of [OWNER_ROLE, APP_ROLE]) {
			const { rowCount } = await client.query('select 1 from pg_roles where rolname = $1', [role]);
			if (rowCount > 0) continue;
			try {
				await client.query(`create role ${ident(role)} login nosuperuser nocreatedb nocreaterole noreplication nobypassrls`);
			} catch (error) {
				if (error.code !== '42710') throw error; // created meanwhile by another process
			}
		}
	});
}

export async function roleExists(url, role) {
	return withClient(url, async (client) => (await client.query('select 1 from pg_roles where rolname = $1', [role])).rowCount > 0);
}

/**
 * Make OWNER_ROLE the owner of a database made before the roles existed (an older `npm start`
 * cluster or a restored backup): the database, the migration bookkeeping and every object in
 * `public` and in graphile-worker's schema. Needs a superuser URL of that database. Does nothing
 * when all is already owned.
 */
export async function handOverToOwner(superDbUrl) {
	await withClient(superDbUrl, async (client) => {
		await client.query(`select set_config('restvolt.owner', $1, false)`, [OWNER_ROLE]);
		await client.query(`do $$
			declare
				owner text := current_setting('restvolt.owner');
				r record;
			begin
				execute format('alter database %I owner to %I', current_database(), owner);
				for r in select n.nspname from pg_namespace n where n.nspname in ('drizzle', 'graphile_worker') and pg_get_userbyid(n.nspowner) <> owner loop
					execute format('alter schema %I owner to %I', r.nspname, owner);
				end loop;
				-- Tables first: their serial and identity sequences follow them.
				for r in select n.nspname, c.relname, c.relkind from pg_class c join pg_namespace n on n.oid = c.relnamespace
					where n.nspname in ('public', 'drizzle', 'graphile_worker') and c.relkind in ('r', 'p', 'v', 'm', 'f') and pg_get_userbyid(c.relowner) <> owner loop
					execute format('alter %s %I.%I owner to %I', case r.relkind when 'v' then 'view' when 'm' then 'materialized view' when 'f' then 'foreign table' else 'table' end, r.nspname, r.relname, owner);
				end loop;
				for r in select n.nspname, c.relname from pg_class c join pg_namespace n on n.oid = c.relnamespace
					where n.nspname in ('public', 'drizzle', 'graphile_worker') and c.relkind = 'S' and pg_get_userbyid(c.relowner) <> owner loop
					execute format('alter sequence %I.%I owner to %I', r.nspname, r.relname, owner);
				end loop;
				for r in select p.oid::regprocedure as signature from pg_proc p join pg_namespace n on n.oid = p.pronamespace
					where n.nspname in ('public', 'graphile_worker') and pg_get_userbyid(p.proowner) <> owner
						and not exists (select 1 from pg_depend d where d.objid = p.oid and d.deptype = 'e') loop
					execute format('alter routine %s owner to %I', r.signature, owner);
				end loop;
				for r in select n.nspname, t.typname from pg_type t join pg_namespace n on n.oid = t.typnamespace
					where n.nspname in ('public', 'graphile_worker') and pg_get_userbyid(t.typowner) <> owner
						and (t.typtype in ('e', 'd') or (t.typtype = 'c' and (select relkind from pg_class where oid = t.typrelid) = 'c')) loop
					execute format('alter type %I.%I owner to %I', r.nspname, r.typname, owner);
				end loop;
			end $$`);
	});
}

/**
 * What APP_ROLE may do in a migrated database: use the schema, read and write rows of every table,
 * use sequences; read and insert only into APPEND_ONLY_TABLES. Default privileges give tables
 * created later by OWNER_ROLE the same row rights (an append-only table must still be listed here).
 * Idempotent; run after every migration by migrateDatabase. Skipped when APP_ROLE does not exist
 * (a database someone else provides, with roles of their own).
 */
export async function grantAppRole(dbUrl) {
	await withClient(dbUrl, async (client) => {
		const { rowCount } = await client.query('select 1 from pg_roles where rolname = $1', [APP_ROLE]);
		if (rowCount === 0) return;
		const app = ident(APP_ROLE);
		await client.query(`grant usage on schema public to ${app}`);
		await client.query(`grant select, insert, update, delete on all tables in schema public to ${app}`);
		await client.query(`grant usage, select on all sequences in schema public to ${app}`);
		for (const table of APPEND_ONLY_TABLES) {
			await client.query(`revoke update, delete, truncate, references, trigger on ${ident(table)} from ${app}`);
		}
		await grantJobQueue(client, app);
		const { rows } = await client.query('select current_user as me, (select rolsuper from pg_roles where rolname = current_user) as super');
		// Default privileges belong to the role that will create the tables: OWNER_ROLE.
		if (rows[0].me === OWNER_ROLE || rows[0].super) {
			const forOwner = `alter default privileges for role ${ident(OWNER_ROLE)} in schema public`;
			await client.query(`${forOwner} grant select, insert, update, delete on tables to ${app}`);
			await client.query(`${forOwner} grant usage, select on sequences to ${app}`);
		}
	});
}

/**
 * graphile-worker's schema (installed by migrateDatabase as the owner): the app adds jobs through
 * its functions (which write as the caller), runs them, and checks the schema version at start.
 */
async function grantJobQueue(client, app) {
	const { rowCount } = await client.query(`select 1 from pg_namespace where nspname = 'graphile_worker'`);
	if (rowCount === 0) return;
	await client.query(`grant usage on schema graphile_worker to ${app}`);
	await client.query(`grant select, insert, update, delete on all tables in schema graphile_worker to ${app}`);
	await client.query(`grant usage, select, update on all sequences in schema graphile_worker to ${app}`);
	await client.query(`grant execute on all functions in schema graphile_worker to ${app}`);
	// Its tables have row-level security switched on with no policy, which only their owner passes.
	const { rows } = await client.query(`
		select c.relname from pg_class c join pg_namespace n on n.oid = c.relnamespace
		where n.nspname = 'graphile_worker' and c.relkind = 'r' and c.relrowsecurity
			and not exists (select 1 from pg_policy p where p.polrelid = c.oid and p.polname = 'restvolt_app_rows')`);
	for (const { relname } of rows) {
		await client.query(`create policy restvolt_app_rows on graphile_worker.${ident(relname)} to ${app} using (true) with check (true)`);
	}
}

/**
 * A database owned by OWNER_ROLE (created when missing, optionally from a template; handed over
 * when it was made before the roles existed), with its three URLs: `superUrl` for administration,
 * `ownerUrl` for migrations and the seed, `appUrl` for the app.
 */
export async function ownedDatabase(serverUrl, name, template) {
	const { ensureDatabase } = await import('./pg.mjs');
	await ensureRoles(serverUrl);
	const superUrl = await ensureDatabase(serverUrl, name, template, { owner: OWNER_ROLE });
	await handOverToOwner(superUrl);
	return { superUrl, ownerUrl: urlAs(superUrl, OWNER_ROLE), appUrl: urlAs(superUrl, APP_ROLE) };
}
