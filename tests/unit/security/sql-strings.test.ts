/**
 * "No SQL built from strings": every query in the app goes through drizzle's query builder or its
 * `sql` tagged template (values become bind parameters). This scans the server code for the ways a
 * string could become SQL text: sql.raw(), a driver .query() with an interpolated template or a
 * concatenated string, and .execute() given something other than a sql`…` template.
 */
import { describe, expect, it } from 'vitest';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, resolve } from 'node:path';

const root = resolve(import.meta.dirname, '../../..');

const RULES: Array<{ name: string; pattern: RegExp }> = [
	{ name: 'sql.raw()', pattern: /\bsql\.raw\s*\(/ },
	{ name: 'interpolated driver query', pattern: /\.query\s*\(\s*`[^`]*\$\{/ },
	{ name: 'concatenated driver query', pattern: /\.query\s*\(\s*['"`][^'"`]*['"`]\s*\+/ },
	{ name: 'execute() without sql``', pattern: /\.execute\s*\(\s*(?!sql`|sql\s*\.|<)[^)\s]/ }
];

function findings(source: string): string[] {
	return RULES.filter((rule) => rule.pattern.test(source)).map((rule) => rule.name);
}

function walk(dir: string): string[] {
	return readdirSync(dir).flatMap((name) => {
		const path = join(dir, name);
		if (statSync(path).isDirectory()) return walk(path);
		return /\.(ts|svelte|js)$/.test(name) ? [path] : [];
	});
}

describe('no SQL built from strings', () => {
	it('the detector recognises each unsafe pattern', () => {
		expect(findings('db.execute(sql.raw(`select * from lots where id = ${id}`))')).toContain('sql.raw()');
		expect(findings('client.query(`select * from lots where po = ${po}`)')).toContain('interpolated driver query');
		expect(findings("client.query('select * from lots where po = ' + po)")).toContain('concatenated driver query');
		expect(findings('db.execute(text)')).toContain('execute() without sql``');
		expect(findings('db.execute(sql`select 1 where id = ${id}`)')).toEqual([]);
		expect(findings("client.query('select $1::int', [1])")).toEqual([]);
	});

	it('the app, its seed and its services contain none of them', () => {
		const files = [...walk(join(root, 'src')), ...walk(join(root, 'seed'))];
		expect(files.length).toBeGreaterThan(20);
		const offending = files.flatMap((file) => findings(readFileSync(file, 'utf8')).map((rule) => `${relative(root, file)}: ${rule}`));
		expect(offending).toEqual([]);
	});
});
