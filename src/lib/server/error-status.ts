/**
 * The one table from a domain error's kind to an HTTP status, shared by the API (http.ts),
 * form actions and page loads (action-errors.ts).
 */
import type { ErrorKind } from './errors';

const STATUS: Record<ErrorKind, number> = {
	malformed: 400,
	invalid: 422,
	unauthenticated: 401,
	forbidden: 403,
	not_found: 404,
	conflict: 409,
	too_large: 413,
	unsupported_type: 415,
	throttled: 429,
	unavailable: 503
};

export const statusOf = (kind: ErrorKind): number => STATUS[kind];

/**
 * A form action answers refused fields with 400, as superforms does for every form that fails its
 * schema, so the page sees one status for "check the marked fields" whoever found the problem.
 */
export const actionStatusOf = (kind: ErrorKind): number => (kind === 'invalid' ? 400 : STATUS[kind]);
