import type { z } from 'zod';

export type HttpMethod = 'get' | 'post' | 'put' | 'patch' | 'delete';

/** A JSON Schema written by hand, for shapes no zod schema describes (files, free-form results). */
export type JsonSchema = Record<string, unknown>;

export interface ResponseSpec {
	description: string;
	/** A zod schema (turned into JSON Schema) or a hand-written JSON Schema; none for an empty body. */
	schema?: z.ZodType | JsonSchema;
	/** application/json unless said otherwise (PDF, XLSX, a stored file). */
	contentType?: string;
}

/**
 * One API operation, described once. `query` and `body` are the very zod schemas the handler
 * parses with (readQuery / readJson), so the document cannot drift from what the server accepts.
 */
export interface ApiOperation {
	method: HttpMethod;
	/** The OpenAPI path below /api/v1, e.g. `/lots/{id}` for src/routes/api/v1/lots/[id=uuid]. */
	path: string;
	tag: string;
	summary: string;
	description?: string;
	/** True for the few routes that answer without sign-in (health, this document). */
	public?: boolean;
	query?: z.ZodType;
	body?: { schema: z.ZodType | JsonSchema; contentType?: string; description?: string };
	/** Success answers by status; the error answers (401, 403, 404, 400, 422, 503) are added from what the operation has. */
	responses: Record<number, ResponseSpec>;
	/** Further error statuses this operation can answer (409, 413, 415, 429 …), with why. */
	errors?: Record<number, string>;
}
