/**
 * The cookie that carries a sign-in's code step between the password and the code. HttpOnly (page
 * scripts never see it), SameSite=Strict, only sent to /signin, and gone after CODE_STEP_MINUTES;
 * the token in it is single-use and only its hash is stored (services/second-factor.ts).
 *
 * Why a server-side step and not "password and code in one form": the password is never echoed
 * back to the page, so asking for both together would make everyone with a second factor type the
 * password twice; and a step row in PostgreSQL, bound to the account, short-lived and voided by a
 * password change, keeps the password itself out of cookies, pages and memory between requests.
 */
import type { Cookies } from '@sveltejs/kit';
import { CODE_STEP_MINUTES } from '$lib/server/services/second-factor';

const NAME = 'restvolt-code-step';
const PATH = '/signin';

export const codeStepToken = (cookies: Cookies): string | null => cookies.get(NAME) || null;

export function keepCodeStep(cookies: Cookies, url: URL, token: string): void {
	cookies.set(NAME, token, {
		path: PATH,
		httpOnly: true,
		sameSite: 'strict',
		secure: url.protocol === 'https:',
		maxAge: CODE_STEP_MINUTES * 60
	});
}

export function dropCodeStep(cookies: Cookies, url: URL): void {
	cookies.delete(NAME, { path: PATH, httpOnly: true, sameSite: 'strict', secure: url.protocol === 'https:' });
}
