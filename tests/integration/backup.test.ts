/** `npm run backup` and `npm run restore` round-trip the demo data. */
import { afterAll, beforeAll, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { existsSync, statSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { freshDatabase, withClient } from '../helpers/db';
import { testEnv } from '../helpers/env';

const root = resolve(import.meta.dirname, '../..');
let db: Awaited<ReturnType<typeof freshDatabase>>;
beforeAll(async () => {
	db = await freshDatabase('backup');
});
afterAll(async () => {
	await db.drop();
});

const TABLES = [
	'organisations',
	'"user"',
	'parts',
	'ocv_models',
	'lots',
	'readings',
	'documents',
	'evaluations',
	'decisions',
	'notices',
	'audit_events'
];

async function fingerprint(url: string) {
	return withClient(url, async (c) => {
		const counts: Record<string, number> = {};
		for (const t of TABLES) counts[t] = Number((await c.query(`select count(*)::int as n from ${t}`)).rows[0].n);
		const lots = await c.query(
			`select md5(coalesce(string_agg(lot_code || status || quantity, ',' order by lot_code), '')) as h from lots`
		);
		return { counts, lots: lots.rows[0].h as string };
	});
}

function npmRun(script: string, args: string[]) {
	return spawnSync('npm', ['run', '--silent', script, '--', ...args], {
		cwd: root,
		env: { ...process.env, DATABASE_URL: db.url },
		encoding: 'utf8'
	});
}

it('restores exactly what was backed up, removing later changes', async () => {
	const file = join(testEnv().scratch, `backup-${Date.now()}.dump`);
	const before = await fingerprint(db.url);
	expect(before.counts.organisations).toBeGreaterThan(0);

	const backup = npmRun('backup', [file]);
	expect(backup.status, backup.stderr).toBe(0);
	expect(existsSync(file) && statSync(file).size > 1000).toBe(true);

	await withClient(db.url, (c) => c.query(`insert into organisations (name, kind) values ('Changed After Backup Ltd', 'supplier')`));
	expect((await fingerprint(db.url)).counts.organisations).toBe(before.counts.organisations + 1);

	const restore = npmRun('restore', [file]);
	expect(restore.status, restore.stderr).toBe(0);
	expect(await fingerprint(db.url)).toEqual(before);
});

it('refuses to restore without a file', () => {
	const res = npmRun('restore', []);
	expect(res.status).not.toBe(0);
	expect(res.stderr).toMatch(/usage/);
});
