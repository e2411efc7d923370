/**
 * Cross-site request check, in place of SvelteKit's own (which looks only at form bodies):
 * every state-changing request (POST, PUT, PATCH, DELETE) must come from the app's own origin
 * when it carries a cookie — with or without a body, whatever its content type — and a form
 * body from another origin is refused even without a cookie, as SvelteKit does.
 *
 * Exempt: API calls authenticated by a bearer token. They carry no cookie a forged page could
 * ride on, and integrations usually send no Origin header.
 */
import { json, text, type Handle } from '@sveltejs/kit';
import { Forbidden } from './errors';
import { errorResponse } from './http';

const FORM_TYPES = ['application/x-www-form-urlencoded', 'multipart/form-data', 'text/plain'];
const UNSAFE_METHODS = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

function isFormContentType(request: Request): boolean {
	const type = request.headers.get('content-type')?.split(';', 1)[0].trim().toLowerCase() ?? '';
	return FORM_TYPES.includes(type);
}

function isBearerApiCall(request: Request, pathname: string): boolean {
	return pathname.startsWith('/api/') && /^Bearer\s+\S+/i.test(request.headers.get('authorization') ?? '');
}

/** Pure: would this request be refused as cross-site? */
export function isCrossSiteWrite(request: Request, url: URL): boolean {
	if (!UNSAFE_METHODS.has(request.method) || isBearerApiCall(request, url.pathname)) return false;
	if (request.headers.get('origin') === url.origin) return false;
	return isFormContentType(request) || request.headers.has('cookie');
}

export const csrfGuard: Handle = async ({ event, resolve }) => {
	const { request, url } = event;
	if (isCrossSiteWrite(request, url)) {
		const message = `Cross-site ${request.method} requests are forbidden`;
		// The JSON API answers in its own error shape; pages keep SvelteKit's answer.
		if (url.pathname.startsWith('/api/')) return errorResponse(new Forbidden(message, 'cross_site'));
		return request.headers.get('accept') === 'application/json' ? json({ message }, { status: 403 }) : text(message, { status: 403 });
	}
	return resolve(event);
};
