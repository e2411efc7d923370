/** Credentials for the benchmark: an API token (the token service, as `npm run token` uses) and a signed-in page session. */
import { createTokenForEmail } from '$lib/server/services/tokens';

export const INSPECTOR = 'inspector@kestrel-mobility.example';
const DEMO_PASSWORD = 'restvolt-demo-2026'; // the seeded demo password (seed/scenario.ts)

export async function bearerFor(email = INSPECTOR): Promise<string> {
	const created = await createTokenForEmail(email, 'bench');
	return created.token;
}

function cookiesOf(response: Response): string {
	return response.headers
		.getSetCookie()
		.map((c) => c.split(';')[0])
		.filter((c) => !c.endsWith('='))
		.join('; ');
}

/** Sign in through the /signin page's password action; returns the Cookie header of the session. */
export async function signInCookie(baseUrl: string, email = INSPECTOR): Promise<string> {
	const body = new URLSearchParams({ email, password: DEMO_PASSWORD, redirectTo: '/' });
	const response = await fetch(`${baseUrl}/signin?/password`, {
		method: 'POST',
		body,
		redirect: 'manual',
		headers: { origin: baseUrl, 'content-type': 'application/x-www-form-urlencoded', 'x-sveltekit-action': 'true' }
	});
	const cookie = cookiesOf(response);
	if (!cookie.includes('session-token')) throw new Error(`sign-in failed (${response.status}): ${(await response.text()).slice(0, 200)}`);
	return cookie;
}

export const bearer = (token: string) => ({ authorization: `Bearer ${token}` });
