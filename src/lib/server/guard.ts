/**
 * Page-level guard, deny by default: staff pages need a staff sign-in, the supplier portal a
 * supplier sign-in. API routes answer 401/403 themselves (through `authorize`), and every load and
 * action still checks `can()` for the specific thing it touches.
 *
 * When the site requires a second factor (RESTVOLT_REQUIRE_TOTP=on), a quality manager or
 * administrator signed in with a cookie who has not enrolled reaches only the enrolment page
 * (and signing out): other pages send them there, API calls answer 403 `second_factor_required`.
 * API tokens are not affected (administrators create them separately).
 */
import { json, redirect, type Handle, type RequestEvent } from '@sveltejs/kit';
import { hasSecondFactor, siteRequiresSecondFactor } from './services/second-factor';

export const ENROL_PATH = '/account/security';

// /signout is open to every role (and harmless when nobody is signed in).
const PUBLIC_PREFIXES = ['/signin', '/signout', '/auth/', '/api/', '/favicon', '/robots.txt', '/_app/'];
/** What someone who must enrol first can still reach. */
const WHILE_ENROLLING = [ENROL_PATH, '/signout', '/auth/', '/favicon', '/robots.txt', '/_app/', '/api/v1/health'];

const startsWithAny = (pathname: string, prefixes: string[]) => prefixes.some((p) => pathname === p || pathname.startsWith(p));

function isPublic(pathname: string): boolean {
	return pathname === '/' || startsWithAny(pathname, PUBLIC_PREFIXES);
}

async function mustEnrolFirst(event: RequestEvent): Promise<boolean> {
	const user = event.locals.user;
	if (!user || event.locals.authMethod !== 'session' || !siteRequiresSecondFactor(user.role)) return false;
	return !(await hasSecondFactor(user.id));
}

export const guard: Handle = async ({ event, resolve }) => {
	const { pathname, search } = event.url;
	if (!startsWithAny(pathname, WHILE_ENROLLING) && (await mustEnrolFirst(event))) {
		if (pathname.startsWith('/api/')) {
			const message = 'This site asks for a second factor: set it up at /account/security before using the API with this session.';
			return json({ error: { code: 'second_factor_required', message } }, { status: 403 });
		}
		redirect(303, ENROL_PATH);
	}
	if (isPublic(pathname)) return resolve(event);
	const user = event.locals.user;
	if (!user) redirect(303, `/signin?redirectTo=${encodeURIComponent(pathname + search)}`);
	const inPortal = pathname === '/portal' || pathname.startsWith('/portal/');
	if (inPortal !== (user.role === 'supplier')) redirect(303, user.role === 'supplier' ? '/portal' : '/');
	return resolve(event);
};
