import { NotFound } from '$lib/server/errors';
import { api } from '$lib/server/http';
import type { RequestHandler } from './$types';

/**
 * Any /api path no route matched (including malformed ids, which the [id=uuid] matchers refuse)
 * answers in the API's error shape rather than with an HTML page.
 */
const unknown: RequestHandler = api(async ({ url }) => {
	throw new NotFound(`No API endpoint at ${url.pathname}`);
});

export const GET = unknown;
export const POST = unknown;
export const PUT = unknown;
export const PATCH = unknown;
export const DELETE = unknown;
