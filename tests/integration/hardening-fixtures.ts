/**
 * Shared set-up for the hardening specs (bad input, access matrix): the API route files as they
 * exist on disk, seeded ids picked from the demo database, and a snapshot of the database that
 * shows whether anything was written.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, resolve } from 'node:path';
import type pg from 'pg';
import { withClient } from '../helpers/db';

const ROOT = resolve(import.meta.dirname, '../..');
export const API_DIR = join(ROOT, 'src/routes/api/v1');

export const VOLTARIA = 'Voltaria Cells Co.'; // supplier A: supplier@voltaria-cells.example
export const FERROLITH = 'Ferrolith Energy'; // supplier B: supplier@ferrolith.example

/** Every `+server.ts` under src/routes/api/v1 (like `find … -name +server.ts`) with the methods it exports. */
export function apiRouteFiles(): Array<{ route: string; methods: string[] }> {
	const found: Array<{ route: string; methods: string[] }> = [];
	const walk = (dir: string) => {
		for (const name of readdirSync(dir)) {
			const path = join(dir, name);
			if (statSync(path).isDirectory()) walk(path);
			else if (name === '+server.ts') {
				const source = readFileSync(path, 'utf8');
				const methods = [...source.matchAll(/export\s+(?:const|async\s+function|function)\s+(GET|POST|PUT|PATCH|DELETE|fallback)\b/g)].map(
					(m) => m[1]
				);
				found.push({ route: relative(API_DIR, dir) || '.', methods: methods.sort() });
			}
		}
	};
	walk(API_DIR);
	return found.sort((a, b) => a.route.localeCompare(b.route));
}

export interface SeedIds {
	supplier: { a: string; b: string };
	/** Supplier A's lots by status (first of each), and supplier B's. */
	lotA: Record<string, string>;
	lotB: Record<string, string>;
	documentA: string;
	documentB: string;
	noticeA: string;
	noticeB: string;
	partA: string;
	partB: string;
	/** A reading of supplier A's accepted lot (not correctable any more). */
	readingOfAcceptedA: number;
	libraryModel: string;
}

const one = async (c: pg.Client, sql: string, params: unknown[] = []) => {
	const { rows } = await c.query(sql, params);
	if (!rows[0]) throw new Error(`seed lookup found nothing: ${sql} ${JSON.stringify(params)}`);
	return Object.values(rows[0])[0] as string;
};

export async function seedIds(url: string): Promise<SeedIds> {
	return withClient(url, async (c) => {
		const org = (name: string) => one(c, 'select id from organisations where name = $1', [name]);
		const a = await org(VOLTARIA);
		const b = await org(FERROLITH);
		const lotsOf = async (supplierId: string) => {
			const { rows } = await c.query(
				'select distinct on (status) status::text as status, id from lots where supplier_id = $1 order by status, created_at',
				[supplierId]
			);
			return Object.fromEntries(rows.map((r) => [r.status, r.id as string]));
		};
		const lotA = await lotsOf(a);
		const lotB = await lotsOf(b);
		const docOf = (supplierId: string) =>
			one(c, 'select d.id from documents d join lots l on l.id = d.lot_id where l.supplier_id = $1 order by d.id limit 1', [supplierId]);
		const noticeOf = (supplierId: string) =>
			one(c, 'select n.id from notices n join lots l on l.id = n.lot_id where l.supplier_id = $1 order by n.created_at limit 1', [
				supplierId
			]);
		const partOf = (supplierId: string) => one(c, 'select id from parts where supplier_id = $1 order by part_number limit 1', [supplierId]);
		return {
			supplier: { a, b },
			lotA,
			lotB,
			documentA: await docOf(a),
			documentB: await docOf(b),
			noticeA: await noticeOf(a),
			noticeB: await noticeOf(b),
			partA: await partOf(a),
			partB: await partOf(b),
			readingOfAcceptedA: Number(await one(c, 'select min(id) from readings where lot_id = $1', [lotA.accepted])),
			libraryModel: await one(c, `select id from ocv_models where approved_at is not null order by created_at limit 1`)
		};
	});
}

/** Tables whose rows legitimately grow when requests fail (audit trail, sign-in throttle). */
const GROWING = ['audit_events', 'sign_in_failures'];
/** Derived state (schema/derived.ts): read-through caches a GET may fill; rebuildable, not data. */
const DERIVED = ['lot_evaluations_cache', 'sampling_states'];

export interface DbSnapshot {
	counts: Record<string, number>;
	audit: number;
	lotsMd5: string;
	readingsMd5: string;
}

export async function snapshot(url: string): Promise<DbSnapshot> {
	return withClient(url, async (c) => {
		const { rows: tables } = await c.query(`select tablename from pg_tables where schemaname = 'public' order by tablename`);
		const counts: Record<string, number> = {};
		let audit = 0;
		for (const { tablename } of tables) {
			const n = Number((await c.query(`select count(*) as n from "${tablename}"`)).rows[0].n);
			if (tablename === 'audit_events') audit = n;
			if (!GROWING.includes(tablename) && !DERIVED.includes(tablename)) counts[tablename] = n;
		}
		const md5 = async (table: string) =>
			(await c.query(`select coalesce(md5(string_agg(t::text, '|' order by t.id)), '') as h from ${table} t`)).rows[0].h as string;
		return { counts, audit, lotsMd5: await md5('lots'), readingsMd5: await md5('readings') };
	});
}
