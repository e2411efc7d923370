/**
 * A database that is down or restarting is not a bug: every API route answers 503
 * `{"error":{"code":"database_unavailable",…}}` and every page a friendly 503 page, never a 500.
 *
 * Such an error shows up in two places:
 *  - thrown by a hook further down the chain (resolving the session or an API token): it reaches
 *    `databaseUnavailable` below, which answers itself;
 *  - thrown inside a load, action or endpoint: SvelteKit catches it and calls `handleError`, which
 *    marks the request (`locals.databaseUnavailable`) and gives the friendly message; SvelteKit then
 *    renders +error.svelte (or JSON) with status 500, which `databaseUnavailable` turns into 503.
 * Endpoints wrapped in http.ts' api() answer 503 themselves (and retry a read once first).
 */
import type { Handle, HandleServerError, RequestEvent } from '@sveltejs/kit';
import { databaseUnavailable as unavailableError, DATABASE_UNAVAILABLE_MESSAGE, errorResponse, isDatabaseUnavailable } from './http';

export const handleError: HandleServerError = ({ error, event, status, message }) => {
	if (isDatabaseUnavailable(error)) {
		event.locals.databaseUnavailable = true;
		console.error(`[db] ${event.request.method} ${event.url.pathname}: the database is unreachable`);
		return { message: DATABASE_UNAVAILABLE_MESSAGE, code: 'database_unavailable' };
	}
	// As SvelteKit's default does: log it (a 404 for an unknown path is no news) and say little.
	if (status !== 404) console.error(error);
	return { message };
};

export const databaseUnavailable: Handle = async ({ event, resolve }) => {
	let response: Response;
	try {
		response = await resolve(event);
	} catch (error) {
		// Kit's own answer to a data request (client-side navigation) is JSON its router reads; leave it.
		if (!isDatabaseUnavailable(error) || event.isDataRequest) throw error;
		console.error(`[db] ${event.request.method} ${event.url.pathname}: the database is unreachable`);
		return unavailableAnswer(event);
	}
	if (!event.locals.databaseUnavailable || event.isDataRequest) return response;
	if (isApi(event)) return errorResponse(unavailableError());
	// The page SvelteKit rendered (+error.svelte, which words this case itself), with the right status.
	const headers = new Headers(response.headers);
	headers.set('retry-after', '2');
	return new Response(response.body, { status: 503, headers });
};

const isApi = (event: RequestEvent) => event.url.pathname.startsWith('/api/');

function unavailableAnswer(event: RequestEvent): Response {
	if (isApi(event) || !acceptsHtml(event.request)) return errorResponse(unavailableError());
	return new Response(UNAVAILABLE_PAGE, {
		status: 503,
		headers: { 'content-type': 'text/html; charset=utf-8', 'retry-after': '2', 'cache-control': 'no-store' }
	});
}

function acceptsHtml(request: Request): boolean {
	const accept = request.headers.get('accept') ?? '';
	return accept === '' || accept.includes('text/html') || accept.includes('*/*');
}

/** The page when a hook could not reach the database (no layout can load without it). */
const UNAVAILABLE_PAGE = `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>Database unavailable · Restvolt</title>
<style>body{font-family:system-ui,sans-serif;max-width:36rem;margin:15vh auto;padding:0 1.5rem;color:#1f2933;line-height:1.5}h1{font-size:1.5rem}</style>
</head>
<body>
<main>
<p><strong>Restvolt</strong></p>
<h1>Database unavailable — try again in a moment</h1>
<p>The database is not reachable right now, so nothing was loaded or saved. This usually passes within a minute: reload the page to try again.</p>
<p><a href="">Reload</a></p>
</main>
</body>
</html>
`;
