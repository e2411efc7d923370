/**
 * The OpenAPI 3.1 document, built from API_OPERATIONS: request shapes through zod 4's own
 * z.toJSONSchema (JSON Schema 2020-12, which OpenAPI 3.1 uses as it is), error answers from what
 * each operation has (sign-in, path parameters, query, body).
 */
import { z } from 'zod';
import { errorShape } from './shapes';
import { API_OPERATIONS } from './operations';
import type { ApiOperation, JsonSchema, ResponseSpec } from './types';

const isZod = (schema: unknown): schema is z.ZodType => schema instanceof z.ZodType;

/** JSON Schema of what a client sends (io: 'input'); refinements that JSON Schema cannot say are left out. */
function jsonSchemaOf(schema: z.ZodType | JsonSchema): JsonSchema {
	if (!isZod(schema)) return schema;
	const { $schema: _dialect, ...rest } = z.toJSONSchema(schema, { io: 'input', unrepresentable: 'any' }) as JsonSchema;
	return rest;
}

const PATH_PARAMETERS: Record<string, { schema: JsonSchema; description: string }> = {
	id: { schema: { type: 'string', format: 'uuid' }, description: 'The id (UUID)' },
	docId: { schema: { type: 'string', format: 'uuid' }, description: 'The document id (UUID)' },
	deliveryId: { schema: { type: 'string', format: 'uuid' }, description: 'The delivery id (UUID)' },
	readingId: { schema: { type: 'integer', minimum: 1 }, description: 'The reading id' },
	code: { schema: { type: 'string' }, description: 'The chemistry code, e.g. NMC or LFP' }
};

const pathParameterNames = (path: string) => [...path.matchAll(/\{(\w+)\}/g)].map((m) => m[1]);

function pathParameters(path: string) {
	return pathParameterNames(path).map((name) => {
		const known = PATH_PARAMETERS[name];
		if (!known) throw new Error(`openapi: no description for the path parameter {${name}} in ${path}`);
		return { name, in: 'path', required: true, ...known };
	});
}

/** A query field is required when leaving it out alone is refused (cross-field rules do not count). */
function queryParameters(query: z.ZodType) {
	const schema = jsonSchemaOf(query) as { properties?: Record<string, JsonSchema> };
	const missing = query.safeParse({});
	const required = new Set(missing.success ? [] : missing.error.issues.filter((i) => i.code !== 'custom').map((i) => String(i.path[0])));
	return Object.entries(schema.properties ?? {}).map(([name, property]) => {
		const { description, ...rest } = property;
		return { name, in: 'query', required: required.has(name), schema: rest, ...(description ? { description } : {}) };
	});
}

const ERROR_WHY: Record<number, string> = {
	400: 'Unreadable input (broken JSON, bad query parameters); `issues` names the fields',
	401: 'Not signed in: send `Authorization: Bearer <token>`',
	403: "The role or the token's scope does not allow this",
	404: 'Not found, or not yours to see',
	422: 'The body does not match the expected shape; `issues` names the fields',
	503: 'The database is not reachable right now; nothing was saved (Retry-After)'
};

function errorStatuses(op: ApiOperation): Record<number, string> {
	const statuses: Record<number, string> = {};
	const add = (status: number) => (statuses[status] = ERROR_WHY[status]);
	if (!op.public) [401, 403].forEach(add);
	if (pathParameterNames(op.path).length > 0) add(404);
	if (op.query || op.body) add(400);
	if (op.body) add(422);
	if (op.path !== '/openapi.json') add(503);
	return { ...statuses, ...op.errors };
}

function response(spec: ResponseSpec) {
	if (!spec.schema) return { description: spec.description };
	return { description: spec.description, content: { [spec.contentType ?? 'application/json']: { schema: jsonSchemaOf(spec.schema) } } };
}

function operationObject(op: ApiOperation) {
	const responses: Record<string, unknown> = {};
	for (const [status, spec] of Object.entries(op.responses)) responses[status] = response(spec);
	for (const [status, why] of Object.entries(errorStatuses(op)))
		responses[status] = { $ref: `#/components/responses/error${status}`, description: why };
	return {
		tags: [op.tag],
		summary: op.summary,
		...(op.description ? { description: op.description } : {}),
		operationId: `${op.method}${op.path.replace(/\{(\w+)\}/g, 'By_$1').replace(/[^A-Za-z0-9]+(.)?/g, (_m, c: string | undefined) => (c ?? '').toUpperCase())}`,
		...(op.public ? { security: [] } : {}),
		parameters: [...pathParameters(op.path), ...(op.query ? queryParameters(op.query) : [])],
		...(op.body
			? {
					requestBody: {
						required: true,
						...(op.body.description ? { description: op.body.description } : {}),
						content: { [op.body.contentType ?? 'application/json']: { schema: jsonSchemaOf(op.body.schema) } }
					}
				}
			: {}),
		responses
	};
}

function errorResponses() {
	const all = new Set<number>([400, 401, 403, 404, 409, 413, 415, 422, 429, 503]);
	const content = { 'application/json': { schema: { $ref: '#/components/schemas/Error' } } };
	return Object.fromEntries([...all].map((status) => [`error${status}`, { description: ERROR_WHY[status] ?? `Error ${status}`, content }]));
}

export function buildOpenApiDocument(operations: readonly ApiOperation[] = API_OPERATIONS) {
	const paths: Record<string, Record<string, unknown>> = {};
	for (const op of operations) (paths[op.path] ??= {})[op.method] = operationObject(op);
	return {
		openapi: '3.1.0',
		info: {
			title: 'Restvolt API',
			version: '1',
			description:
				'Receiving inspection of battery cells and packs: lots, readings, evaluations, decisions, notices, webhooks. ' +
				'Errors are `{"error":{"code","message","issues"?}}`. Send an API token as `Authorization: Bearer <token>`; a token acts ' +
				"as its person, within its scope (read, readings:write, webhooks:manage or the person's whole role)."
		},
		servers: [{ url: '/api/v1' }],
		security: [{ bearer: [] }],
		tags: [...new Set(operations.map((o) => o.tag))].map((name) => ({ name })),
		paths,
		components: {
			securitySchemes: { bearer: { type: 'http', scheme: 'bearer', description: 'An API token from Administration → API tokens (rv_…)' } },
			schemas: { Error: jsonSchemaOf(errorShape) },
			responses: errorResponses()
		}
	};
}

export type OpenApiDocument = ReturnType<typeof buildOpenApiDocument>;
