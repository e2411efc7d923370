/**
 * Page-level guard, deny by default: staff pages need a staff sign-in, the supplier portal a
 * supplier sign-in. API routes answer 401/403 themselves (through `authorize`), and every load and
 * action still checks `can()` for the specific thing it touches.
 */
import { redirect, type Handle } from '@sveltejs/kit';

// /signout is open to every role (and harmless when nobody is signed in).
const PUBLIC_PREFIXES = ['/signin', '/signout', '/auth/', '/api/', '/favicon', '/robots.txt', '/_app/'];

function isPublic(pathname: string): boolean {
	return pathname === '/' || PUBLIC_PREFIXES.some((p) => pathname === p || pathname.startsWith(p));
}

export const guard: Handle = async ({ event, resolve }) => {
	const { pathname, search } = event.url;
	if (isPublic(pathname)) return resolve(event);
	const user = event.locals.user;
	if (!user) redirect(303, `/signin?redirectTo=${encodeURIComponent(pathname + search)}`);
	const inPortal = pathname === '/portal' || pathname.startsWith('/portal/');
	if (inPortal !== (user.role === 'supplier')) redirect(303, user.role === 'supplier' ? '/portal' : '/');
	return resolve(event);
};
