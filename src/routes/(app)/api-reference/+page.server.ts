import { buildOpenApiDocument } from '$lib/server/openapi';
import type { PageServerLoad } from './$types';

interface Parameter {
	name: string;
	in: string;
	required: boolean;
	description?: string;
	schema: Record<string, unknown>;
}

interface Operation {
	tags: string[];
	summary: string;
	description?: string;
	security?: unknown[];
	parameters: Parameter[];
	requestBody?: { content: Record<string, { schema: unknown }> };
	responses: Record<string, { description: string; content?: Record<string, { schema: unknown }> }>;
}

/** The served OpenAPI document, grouped by tag for reading; the page renders it with our own components. */
export const load: PageServerLoad = () => {
	const doc = buildOpenApiDocument();
	const operations = Object.entries(doc.paths).flatMap(([path, methods]) =>
		Object.entries(methods as Record<string, Operation>).map(([method, op]) => {
			const body = op.requestBody ? Object.entries(op.requestBody.content)[0] : undefined;
			return {
				id: `${method}-${path}`.replace(/[^a-z0-9]+/gi, '-'),
				method: method.toUpperCase(),
				path: `/api/v1${path}`,
				tag: op.tags[0],
				summary: op.summary,
				description: op.description ?? null,
				public: Array.isArray(op.security) && op.security.length === 0,
				parameters: op.parameters.map((p) => ({
					name: p.name,
					in: p.in,
					required: p.required,
					type: String(p.schema.type ?? p.schema.format ?? 'value'),
					description: p.description ?? null
				})),
				body: body ? { contentType: body[0], schema: JSON.stringify(body[1].schema, null, 2) } : null,
				responses: Object.entries(op.responses).map(([status, r]) => ({ status, description: r.description }))
			};
		})
	);
	const tags = [...new Set(operations.map((o) => o.tag))];
	return { title: doc.info.title, intro: doc.info.description, tags, operations };
};
