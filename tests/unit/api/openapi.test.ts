/**
 * The OpenAPI document covers every /api/v1 route and is a valid OpenAPI 3.1 document, checked by
 * @seriousme/openapi-schema-validator against the OpenAPI Initiative's published 3.1 schema.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, resolve } from 'node:path';
import { Validator } from '@seriousme/openapi-schema-validator';
import { describe, expect, it } from 'vitest';
import { API_OPERATIONS, buildOpenApiDocument } from '$lib/server/openapi';

const API_ROOT = resolve(import.meta.dirname, '../../../src/routes/api/v1');
const METHODS = ['GET', 'POST', 'PUT', 'PATCH', 'DELETE'] as const;

function routeFiles(dir: string): string[] {
	return readdirSync(dir).flatMap((name) => {
		const path = join(dir, name);
		if (statSync(path).isDirectory()) return routeFiles(path);
		return name === '+server.ts' ? [path] : [];
	});
}

/** `lots/[id=uuid]/readings/[readingId]/+server.ts` → `/lots/{id}/readings/{readingId}`. */
function openApiPath(file: string): string {
	const dir = relative(API_ROOT, file).replace(/\/?\+server\.ts$/, '');
	return `/${dir}`.replace(/\[(\w+)(?:=\w+)?\]/g, '{$1}').replace(/\/$/, '') || '/';
}

/** Every `METHOD path` the route files export. */
function routeOperations(): string[] {
	return routeFiles(API_ROOT).flatMap((file) => {
		const source = readFileSync(file, 'utf8');
		return METHODS.filter((m) => new RegExp(`export const ${m}\\b`).test(source)).map((m) => `${m.toLowerCase()} ${openApiPath(file)}`);
	});
}

describe('OpenAPI document', () => {
	it('describes every method of every route file under src/routes/api/v1, and nothing else', () => {
		const routes = routeOperations().sort();
		const described = API_OPERATIONS.map((o) => `${o.method} ${o.path}`).sort();
		expect(routes.length).toBeGreaterThan(30);
		// A failure here names the route to add to src/lib/server/openapi/operations.ts (or the entry to remove).
		expect(routes.filter((r) => !described.includes(r))).toEqual([]);
		expect(described.filter((d) => !routes.includes(d))).toEqual([]);
		expect(new Set(described).size).toBe(described.length);
	});

	it('is a valid OpenAPI 3.1 document', async () => {
		const result = await new Validator().validate(buildOpenApiDocument() as unknown as Parameters<Validator['validate']>[0]);
		expect(result.errors ?? []).toEqual([]);
		expect(result.valid).toBe(true);
	});

	it('requires a bearer token except on the public routes, and gives every operation the error shape', () => {
		const doc = buildOpenApiDocument();
		expect(doc.security).toEqual([{ bearer: [] }]);
		const health = doc.paths['/health'].get as { security?: unknown[]; responses: Record<string, unknown> };
		expect(health.security).toEqual([]);
		const lots = doc.paths['/lots'].post as { responses: Record<string, unknown>; requestBody: unknown };
		expect(Object.keys(lots.responses)).toEqual(expect.arrayContaining(['201', '400', '401', '403', '422', '503']));
		expect(JSON.stringify(lots.requestBody)).toContain('"po_number"');
	});

	it('marks a query parameter required only when leaving it out is refused', () => {
		const doc = buildOpenApiDocument();
		const trace = doc.paths['/readings'].get as { parameters: { name: string; required: boolean }[] };
		expect(trace.parameters.map((p) => [p.name, p.required])).toEqual([
			['serial', false],
			['serial_prefix', false],
			['limit', false]
		]);
		const plan = doc.paths['/sampling/plan'].get as { parameters: { name: string; required: boolean }[] };
		expect(plan.parameters.find((p) => p.name === 'lot_size')?.required).toBe(true);
	});
});
