/**
 * Every form action whose schema has a number field reads its post through validateForm
 * (src/lib/server/forms.ts), never superValidate alone, which reads `1e7` and `1,5` as 1. Found by
 * reading the route files: a new action or a new number field in an existing form is covered too.
 */
import { describe, expect, it } from 'vitest';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, resolve } from 'node:path';
import { zod4 } from 'sveltekit-superforms/adapters';
import type { z } from 'zod';
import { numberFields } from '../../../src/lib/server/forms';

const root = resolve(import.meta.dirname, '../../..');

function files(dir: string, match: (name: string) => boolean): string[] {
	return readdirSync(dir).flatMap((name) => {
		const path = join(dir, name);
		return statSync(path).isDirectory() ? files(path, match) : match(name) ? [path] : [];
	});
}

/** Every exported zod schema of the shared and route-local schema modules, by name. */
async function exportedSchemas(): Promise<Map<string, z.ZodType>> {
	const modules = [
		...files(join(root, 'src/lib/schemas'), (n) => n.endsWith('.ts')),
		...files(join(root, 'src/routes'), (n) => n === 'schemas.ts')
	];
	const found = new Map<string, z.ZodType>();
	for (const path of modules) {
		const mod = (await import(path)) as Record<string, unknown>;
		for (const [name, value] of Object.entries(mod)) {
			if (value && typeof value === 'object' && '_zod' in value) found.set(name, value as z.ZodType);
		}
	}
	return found;
}

/** `superValidate(event|request|{ request }, zod4(name)` calls: the ones that read a posted body. */
const POSTED_READ = /superValidate\(\s*(?:event|request|\{\s*request\s*\})\s*,\s*zod4\((\w+)\)/g;

describe('form posts with number fields', () => {
	it('go through validateForm', async () => {
		const schemas = await exportedSchemas();
		const routeFiles = files(join(root, 'src/routes'), (n) => n.endsWith('.server.ts') || n.endsWith('.ts'));
		const offenders: string[] = [];
		let checked = 0;
		for (const path of routeFiles) {
			const source = readFileSync(path, 'utf8');
			for (const [, name] of source.matchAll(POSTED_READ)) {
				checked++;
				// Imported under another name (`import { x as name }`)?
				const original = new RegExp(`(\\w+)\\s+as\\s+${name}\\b`).exec(source)?.[1];
				const schema = schemas.get(name) ?? (original ? schemas.get(original) : undefined);
				// A schema declared in the route file itself: judged by what it is built from.
				const hasNumbers = schema
					? numberFields(zod4(schema as never).jsonSchema as never).size > 0
					: new RegExp(`const ${name} = z[\\s\\S]*?\\n\\}\\)`).exec(source)?.[0].match(/z\.(number|int|coerce)|wholeNumber|decimal/) !==
						null;
				if (hasNumbers) offenders.push(`${relative(root, path)}: ${name}`);
			}
		}
		expect(checked, 'superValidate calls on posted forms found').toBeGreaterThan(5);
		expect(offenders).toEqual([]);
	});

	it('are found by this check (the lot form has number fields)', async () => {
		const schemas = await exportedSchemas();
		expect(numberFields(zod4(schemas.get('lotFormSchema') as never).jsonSchema as never).size).toBe(2);
		expect(numberFields(zod4(schemas.get('partLimitsSchema') as never).jsonSchema as never).size).toBeGreaterThan(5);
	});
});
