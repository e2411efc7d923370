/**
 * Signing in from tests, through the real pages (never by forging cookies):
 *
 *   signInApi(baseUrl, email, password)   → a `Cookie` header string for fetch (staff, password form)
 *   tokenFor(databaseUrl, email)          → an API token (the same service `npm run token` uses)
 *   signInPage(page, baseUrl, email, pw?) → Playwright: staff password sign-in on /signin
 *   signInSupplierByLink(page, baseUrl, email, mailHttpUrl?) → Playwright: supplier e-mail link
 *   signInApiWithCode / signInPageWithCode   → the same for staff with a second factor (password, then code)
 *   totpCode(secret, stepsAhead?), secretFromSecurityPage(html) → codes from the key the page shows
 *
 * Form POSTs send an `Origin` header, because SvelteKit refuses cross-site form posts.
 * Staff demo password: DEMO_PASSWORD. Each wrong password counts towards the sign-in throttle
 * (5 per account and 20 per client address per 15 minutes), so use a fresh database per file.
 */
import { spawn } from 'node:child_process';
import { resolve } from 'node:path';
import type { Page } from '@playwright/test';
import { Secret, TOTP } from 'otpauth';
import { waitForMail, type ReceivedMail } from './mail';
import { testEnv } from './env';

export const DEMO_PASSWORD = 'restvolt-demo-2026';

/** A tiny cookie jar: name → value, updated from Set-Cookie headers. */
export class CookieJar {
	readonly cookies = new Map<string, string>();
	take(response: Response) {
		for (const line of response.headers.getSetCookie()) {
			const [pair, ...attrs] = line.split(';');
			const eq = pair.indexOf('=');
			const name = pair.slice(0, eq).trim();
			const value = pair.slice(eq + 1).trim();
			const expired = attrs.some((a) => /^\s*max-age=0\s*$/i.test(a) || /^\s*expires=Thu, 01 Jan 1970/i.test(a));
			if (expired || value === '') this.cookies.delete(name);
			else this.cookies.set(name, value);
		}
	}
	header(): string {
		return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
	}
}

/** POST a form like a browser on the same site would (Origin header, urlencoded body). */
export async function postForm(baseUrl: string, path: string, fields: Record<string, string>, cookie = ''): Promise<Response> {
	return fetch(`${baseUrl}${path}`, {
		method: 'POST',
		redirect: 'manual',
		headers: {
			origin: baseUrl,
			accept: 'text/html', // a real 303 from form actions, as a browser gets without JavaScript
			'content-type': 'application/x-www-form-urlencoded',
			...(cookie ? { cookie } : {})
		},
		body: new URLSearchParams(fields)
	});
}

/**
 * Sign in with the staff password form (POST /signin?/password) and return the cookie header.
 * Throws with the page's answer when the sign-in is refused.
 */
export async function signInApi(baseUrl: string, email: string, password = DEMO_PASSWORD): Promise<string> {
	const jar = new CookieJar();
	const res = await postForm(baseUrl, '/signin?/password', { email, password, redirectTo: '/' });
	jar.take(res);
	if (res.status !== 303 || !jar.header().includes('session-token')) {
		throw new Error(`sign-in as ${email} refused: ${res.status} ${await res.text()}`);
	}
	return jar.header();
}

/** Create an API token for an existing user by running `npm run token` (scripts/token.ts). */
export async function tokenFor(databaseUrl: string, email: string): Promise<string> {
	const { code, stdout, stderr } = await runTokenCommand(databaseUrl, ['--email', email]);
	if (code !== 0) throw new Error(`npm run token failed (${code}): ${stderr}`);
	return stdout.trim().split('\n').at(-1)!.trim();
}

/** Run the token command as a user would (`npx tsx scripts/token.ts …`); for tests of the command itself. */
export function runTokenCommand(databaseUrl: string, args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
	const root = resolve(import.meta.dirname, '../..');
	return new Promise((done, fail) => {
		const child = spawn('npm', ['run', '--silent', 'token', '--', ...args], {
			cwd: root,
			env: { ...process.env, DATABASE_URL: databaseUrl },
			stdio: ['ignore', 'pipe', 'pipe']
		});
		let stdout = '';
		let stderr = '';
		child.stdout.on('data', (d) => (stdout += d));
		child.stderr.on('data', (d) => (stderr += d));
		child.once('error', fail);
		child.once('exit', (code) => done({ code: code ?? 1, stdout, stderr }));
	});
}

/** Playwright: sign in as staff on /signin and wait until the app has left the sign-in page. */
export async function signInPage(page: Page, baseUrl: string, email: string, password = DEMO_PASSWORD): Promise<void> {
	await page.goto(`${baseUrl}/signin`);
	await page.getByLabel('Work e-mail').fill(email);
	await page.getByLabel('Password').fill(password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await page.waitForURL((url) => !url.pathname.startsWith('/signin'));
}

/** The newest sign-in link mailed to `email` after `since` (ms epoch), from the local SMTP peer. */
export async function signInLinkFor(email: string, since: number, mailHttpUrl = testEnv().mailHttpUrl): Promise<string> {
	const isLink = (m: ReceivedMail) =>
		m.envelope.to.includes(email) && m.subject.includes('sign-in link') && Number(m.id.split('-')[0]) >= since;
	const mails = await waitForMail(isLink, { baseUrl: mailHttpUrl });
	const url = /https?:\/\/\S+\/auth\/callback\/nodemailer\?\S+/.exec(mails.at(-1)!.text)?.[0];
	if (!url) throw new Error(`no sign-in link in the mail to ${email}`);
	return url;
}

/** Playwright: a supplier asks for a link on /signin, reads it from the mail peer and follows it. */
export async function signInSupplierByLink(page: Page, baseUrl: string, email: string, mailHttpUrl = testEnv().mailHttpUrl): Promise<void> {
	const since = Date.now() - 1000;
	await page.goto(`${baseUrl}/signin`);
	await page.getByLabel('E-mail', { exact: true }).fill(email);
	await page.getByRole('button', { name: 'E-mail me a sign-in link' }).click();
	await page.waitForURL('**/signin/link-sent');
	await page.goto(await signInLinkFor(email, since, mailHttpUrl));
	await page.waitForURL((url) => url.pathname.startsWith('/portal'));
}

// ---- second factor (TOTP) ----

/**
 * The current TOTP code (RFC 6238: SHA-1, 6 digits, 30 s) for a base32 secret as the security page
 * shows it (spaces allowed), `stepsAhead` × 30 s from now. The server accepts ±1 step and never a
 * step at or before the last one it accepted, so a test that needs a fresh code soon after using
 * one asks for the next step (stepsAhead = 1) instead of waiting.
 */
export function totpCode(secret: string, stepsAhead = 0): string {
	return TOTP.generate({ secret: Secret.fromBase32(secret.replace(/\s+/g, '')), timestamp: Date.now() + stepsAhead * 30_000 });
}

/** The typed key from an /account/security page's HTML (the "Cannot scan it?" text). */
export function secretFromSecurityPage(html: string): string {
	const match = /data-testid="totp-secret"[^>]*>([A-Z2-7 ]+)</.exec(html);
	if (!match) throw new Error('no TOTP secret on the security page');
	return match[1].replace(/\s+/g, '');
}

/**
 * Sign in as staff whose account has a second factor on: the password step (which answers with
 * the code-step cookie), then POST /signin?/code. Returns the session cookie header; throws with
 * the page's answer when either step is refused.
 */
export async function signInApiWithCode(baseUrl: string, email: string, code: string, password = DEMO_PASSWORD): Promise<string> {
	const jar = new CookieJar();
	const first = await postForm(baseUrl, '/signin?/password', { email, password, redirectTo: '/' });
	jar.take(first);
	if (first.status !== 303 || !jar.header().includes('restvolt-code-step')) {
		throw new Error(`password step for ${email} refused: ${first.status} ${await first.text()}`);
	}
	const second = await postForm(baseUrl, '/signin?/code', { code, redirectTo: '/' }, jar.header());
	jar.take(second);
	if (second.status !== 303 || !jar.header().includes('session-token')) {
		throw new Error(`code step for ${email} refused: ${second.status} ${await second.text()}`);
	}
	jar.cookies.delete('restvolt-code-step');
	return jar.header();
}

/** Playwright: staff sign-in with a second factor; `code` is asked for when the code step shows. */
export async function signInPageWithCode(
	page: Page,
	baseUrl: string,
	email: string,
	code: () => string,
	password = DEMO_PASSWORD
): Promise<void> {
	await page.goto(`${baseUrl}/signin`);
	await page.getByLabel('Work e-mail').fill(email);
	await page.getByLabel('Password').fill(password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await page.getByLabel('6-digit code').fill(code());
	await page.getByRole('button', { name: 'Confirm and sign in' }).click();
	await page.waitForURL((url) => !url.pathname.startsWith('/signin'));
}
