import { clientAddress, signOutOf } from '$lib/server/auth';
import { recordSignOut } from '$lib/server/services/sign-in';
import type { RequestHandler } from './$types';

/** POST /signout (the header's button): audit, clear the session cookie, back to /signin. */
export const POST: RequestHandler = async (event) => {
	if (event.locals.user && event.locals.authMethod === 'session') {
		await recordSignOut(event.locals.user, clientAddress(event));
	}
	return signOutOf(event, '/signin?signed-out');
};
