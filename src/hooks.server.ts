import { sequence } from '@sveltejs/kit/hooks';
import type { Handle } from '@sveltejs/kit';
import { authHandle, resolveUser } from '$lib/server/auth';
import { guard } from '$lib/server/guard';
import { csrfGuard } from '$lib/server/csrf';
import { building } from '$app/environment';
import { startBackgroundWork } from '$lib/server/background';
import { databaseUnavailable } from '$lib/server/unavailable';

if (!building) startBackgroundWork();

/** Headers CSP does not cover (CSP itself comes from kit.csp in svelte.config.js). */
const securityHeaders: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	const set = (name: string, value: string) => {
		if (!response.headers.has(name)) response.headers.set(name, value);
	};
	set('X-Content-Type-Options', 'nosniff');
	set('Referrer-Policy', 'strict-origin-when-cross-origin');
	set('X-Frame-Options', 'DENY');
	set('Permissions-Policy', 'camera=(), microphone=(), geolocation=()');
	if (event.url.pathname.startsWith('/api/')) {
		set('Content-Security-Policy', "default-src 'none'; frame-ancestors 'none'");
		set('Cache-Control', 'no-store');
	}
	return response;
};

export const handle: Handle = sequence(securityHeaders, databaseUnavailable, csrfGuard, authHandle, resolveUser, guard);
export { handleError } from '$lib/server/unavailable';
