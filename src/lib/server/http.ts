/**
 * JSON API conventions: errors are `{"error":{"code","message","issues"?}}` with a 4xx status;
 * bodies are parsed with zod; authorisation goes through the policy.
 */
import { json, type RequestEvent } from '@sveltejs/kit';
import type { z } from 'zod';
import { can, type Action, type Resource, type SessionUser } from './policy';
import { isDatabaseUnavailable } from './db/unavailable';
import { statusOf } from './error-status';
import { scopeAllows } from './token-scopes';
import { Conflict, DomainError, Forbidden, Invalid, Malformed, NotFound, Unauthenticated, Unavailable, type Issue } from './errors';

export { isDatabaseUnavailable };

export type ApiIssue = Issue;

/** The one place a domain error (errors.ts) becomes the API's status and error shape. */
export function errorResponse(error: DomainError): Response {
	return errorJson(statusOf(error.kind), error.code, error.message, error.issues);
}

function errorJson(status: number, code: string, message: string, issues?: Issue[]): Response {
	const body = { error: { code, message, ...(issues ? { issues } : {}) } };
	// A 503 is temporary (the database restarting): tell clients when to try again.
	return json(body, { status, headers: status === 503 ? { 'retry-after': '2' } : undefined });
}

export const DATABASE_UNAVAILABLE_MESSAGE = 'The database is not reachable right now; nothing was saved. Try again in a moment.';
/** The answer while PostgreSQL is down or restarting (also given by the hooks, unavailable.ts). */
export const databaseUnavailable = () => new Unavailable(DATABASE_UNAVAILABLE_MESSAGE, 'database_unavailable');

/** Short names for the domain errors API routes throw most (the same classes services throw). */
export const badRequest = (message: string, issues?: ApiIssue[]) => new Malformed(message, issues);
export const notFound = (what = 'resource') => new NotFound(what);
export const conflict = (message: string) => new Conflict(message);
export const unprocessable = (message: string, issues?: ApiIssue[]) => new Invalid(message, issues);

export function zodIssues(error: z.ZodError): ApiIssue[] {
	return error.issues.map((i) => ({ path: i.path.map(String).join('.'), message: i.message }));
}

/** The issues as one line for a page's error message: `search: must not contain …; limit: …`. */
export const issuesText = (error: z.ZodError) =>
	zodIssues(error)
		.map((i) => `${i.path}: ${i.message}`)
		.join('; ');

/**
 * Parse a JSON body against a schema; 400 for unreadable JSON (naming the field where it broke,
 * e.g. `"quantity": 1,5`), 422 for a wrong shape.
 */
export async function readJson<T extends z.ZodType>(request: Request, schema: T): Promise<z.infer<T>> {
	return parseWith(schema, await readJsonValue(request), 'The request body');
}

/** The JSON body as a plain value; 400 naming the field where the JSON broke. */
export async function readJsonValue(request: Request): Promise<unknown> {
	let text: string;
	try {
		text = await request.text();
	} catch {
		throw badRequest('The request body could not be read');
	}
	try {
		return JSON.parse(text);
	} catch (error) {
		throw badRequest(`The request body is not valid JSON (${(error as Error).message})`, jsonSyntaxIssues(text, error as Error));
	}
}

/** The field whose value broke the JSON: the last `"key":` before where it broke. */
export function jsonSyntaxIssues(text: string, error: Error): ApiIssue[] | undefined {
	// V8 names the position for some errors only ("Unexpected token … is not valid JSON" has none).
	const position = brokenValueAt(text) ?? Number(/position (\d+)/.exec(error.message)?.[1] ?? text.length);
	const keys = [...text.slice(0, position).matchAll(/"((?:[^"\\]|\\.)*)"\s*:/g)];
	const key = keys.at(-1)?.[1];
	if (key === undefined) return undefined;
	return [
		{ path: key, message: 'is not valid JSON here: write numbers like 12 or 1.5 (no comma decimals, no units) and text in double quotes' }
	];
}

export function parseWith<T extends z.ZodType>(schema: T, value: unknown, what: string): z.infer<T> {
	const parsed = schema.safeParse(value);
	if (!parsed.success) throw unprocessable(`${what} does not match the expected shape`, zodIssues(parsed.error));
	return parsed.data;
}

/**
 * Where the first value that is not JSON starts (`1,5`, `.5`, `12abc`, `NaN` after a key), or
 * undefined: a small scan of values and commas outside strings, not a whole parser.
 */
export function brokenValueAt(text: string): number | undefined {
	const scalar = /\s*(?:-?(?:0|[1-9]\d*)(?:\.\d+)?(?:[eE][+-]?\d+)?|true|false|null)\s*(?=[,}\]]|$)/y;
	const open: string[] = [];
	for (let i = 0; i < text.length; i++) {
		const c = text[i];
		if (c === '"') {
			for (i++; i < text.length && text[i] !== '"'; i++) if (text[i] === '\\') i++;
			continue;
		}
		if (c === '{' || c === '[') open.push(c);
		else if (c === '}' || c === ']') open.pop();
		if (c !== ':' && c !== ',' && c !== '[') continue;
		let next = i + 1;
		while (next < text.length && /\s/.test(text[next])) next++;
		const ahead = text[next];
		// In an object a comma is followed by a key; elsewhere a value follows.
		if (c === ',' && open.at(-1) === '{') {
			if (ahead !== '"') return next;
			continue;
		}
		if (ahead === '"' || ahead === '{' || ahead === '[' || ahead === ']') continue;
		scalar.lastIndex = i + 1;
		if (!scalar.test(text)) return next;
	}
	return undefined;
}

/** Parse query-string parameters (as an object of strings) against a schema; 400 on failure. */
export function readQuery<T extends z.ZodType>(url: URL, schema: T): z.infer<T> {
	const parsed = schema.safeParse(Object.fromEntries(url.searchParams));
	if (!parsed.success) throw badRequest('The query parameters are not valid', zodIssues(parsed.error));
	return parsed.data;
}

/** 401 when nobody is signed in, 403 when the role may not do this. */
export function authorize(event: Pick<RequestEvent, 'locals'>, action: Action, resource?: Resource): SessionUser {
	const user = event.locals.user;
	if (!user) throw new Unauthenticated('Sign in or send an API token (Authorization: Bearer …)');
	if (!can(user, action, resource)) throw new Forbidden('Your role may not do this');
	const scope = event.locals.tokenScope;
	if (scope && !scopeAllows(scope, action)) throw new Forbidden(`This API token's scope (${scope}) does not cover this`, 'token_scope');
	return user;
}

/** Wait before the one retry of a read that met an unreachable database (a restart takes about a second). */
const READ_RETRY_MS = 1000;

/**
 * Wrap a handler so domain errors (errors.ts) become the status and error shape and nothing unexpected leaks as a 5xx body
 * with internals (it is logged; the client sees a plain 500). An unreachable database answers 503
 * `database_unavailable`; a GET or HEAD (a read, safe to repeat) is tried once more first.
 */
export function api<E extends RequestEvent>(handler: (event: E) => Promise<Response> | Response) {
	return async (event: E): Promise<Response> => {
		const isRead = event.request.method === 'GET' || event.request.method === 'HEAD';
		try {
			return await handler(event);
		} catch (error) {
			if (!(isRead && isDatabaseUnavailable(error))) return failure(event, error);
			console.error(`[api] ${event.request.method} ${event.url.pathname}: database unreachable, trying once more`);
		}
		await new Promise((resolve) => setTimeout(resolve, READ_RETRY_MS));
		try {
			return await handler(event);
		} catch (error) {
			return failure(event, error);
		}
	};
}

function failure(event: RequestEvent, error: unknown): Response {
	if (error instanceof DomainError) return errorResponse(error);
	if (isKitResponse(error)) throw error;
	console.error(`[api] ${event.request.method} ${event.url.pathname}`, error);
	if (isDatabaseUnavailable(error)) return errorResponse(databaseUnavailable());
	return errorJson(500, 'internal', 'Something went wrong on the server');
}

function isKitResponse(error: unknown): boolean {
	return typeof error === 'object' && error !== null && 'status' in error && ('location' in error || 'body' in error);
}
