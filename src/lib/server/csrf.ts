/**
 * Cross-site request check. It is SvelteKit's own origin check (same content types, same methods,
 * same answer), moved into a hook for one reason: an API call authenticated by a bearer token —
 * e.g. a meter-file or document upload from an integration — carries no cookie a forged page
 * could ride on, and usually no Origin header either, so it must not be refused. Everything else,
 * form actions included, is checked exactly as before.
 */
import { json, text, type Handle } from '@sveltejs/kit';
import { ApiError, errorResponse } from './http';

const FORM_TYPES = ['application/x-www-form-urlencoded', 'multipart/form-data', 'text/plain'];
const UNSAFE_METHODS = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

function isFormContentType(request: Request): boolean {
	const type = request.headers.get('content-type')?.split(';', 1)[0].trim().toLowerCase() ?? '';
	return FORM_TYPES.includes(type);
}

function isBearerApiCall(request: Request, pathname: string): boolean {
	return pathname.startsWith('/api/') && /^Bearer\s+\S+/i.test(request.headers.get('authorization') ?? '');
}

export const csrfGuard: Handle = async ({ event, resolve }) => {
	const { request, url } = event;
	const crossSite =
		UNSAFE_METHODS.has(request.method) &&
		isFormContentType(request) &&
		request.headers.get('origin') !== url.origin &&
		!isBearerApiCall(request, url.pathname);
	if (crossSite) {
		const message = `Cross-site ${request.method} form submissions are forbidden`;
		// The JSON API answers in its own error shape; pages keep SvelteKit's answer.
		if (url.pathname.startsWith('/api/')) return errorResponse(new ApiError(403, 'cross_site', message));
		return request.headers.get('accept') === 'application/json' ? json({ message }, { status: 403 }) : text(message, { status: 403 });
	}
	return resolve(event);
};
