/**
 * The TOTP second factor against the built app: enrolment through the security page's forms (the
 * code computed from the key the page shows), the code step of signing in, wrong and replayed
 * codes, turning it off, and the site setting RESTVOLT_REQUIRE_TOTP=on. Codes follow RFC 6238
 * (SHA-1, 6 digits, 30 s); the server accepts ±1 step and never a step it already accepted, so
 * a test that needs a second fresh code asks for the next step (totpCode(secret, 1)).
 *
 * Each person here has their own factor (their own "last step"); wrong attempts stay well under
 * the client address's 20 per 15 minutes.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startApp, type RunningApp } from '../helpers/app';
import { freshDatabase, withClient } from '../helpers/db';
import {
	CookieJar,
	DEMO_PASSWORD,
	postForm,
	secretFromSecurityPage,
	signInApi,
	signInApiWithCode,
	tokenFor,
	totpCode
} from '../helpers/auth';

const QUALITY = 'quality@kestrel-mobility.example';
const QUALITY2 = 'quality2@kestrel-mobility.example';
const INSPECTOR = 'inspector@kestrel-mobility.example';
const INSPECTOR2 = 'inspector2@kestrel-mobility.example';
const ADMIN = 'admin@kestrel-mobility.example';
const BUYER = 'buyer@kestrel-mobility.example';
const WRONG_CODE_TEXT = 'That code does not match.';
const ENROL_REFUSED_TEXT = 'That password and code do not match.';
const THROTTLED_TEXT = 'Too many attempts';

/** A session QUALITY signed in to with password and code, kept for the last describe (a lost phone). */
let qualityCodeSession = '';
let app: RunningApp;
let db: { url: string; drop: () => Promise<void> };

beforeAll(async () => {
	db = await freshDatabase('second_factor');
	app = await startApp({ databaseUrl: db.url });
});

afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

const get = (base: string, path: string, cookie: string) => fetch(`${base}${path}`, { redirect: 'manual', headers: { cookie } });
const sql = <T>(text: string, params: unknown[] = []) => withClient(db.url, async (c) => (await c.query(text, params)).rows as T[]);

async function factorRow(email: string) {
	const rows = await sql<{ sealed_secret: string; enabled_at: Date | null; last_step: string | null }>(
		'select f.sealed_secret, f.enabled_at, f.last_step from second_factors f join "user" u on u.id = f.user_id where u.email = $1',
		[email]
	);
	return rows[0] ?? null;
}

async function auditCount(action: string, email: string, method?: string): Promise<number> {
	const rows = await sql<{ n: number }>(
		`select count(*)::int as n from audit_events where action = $1 and actor_email = $2 and ($3::text is null or details->>'method' = $3)`,
		[action, email, method ?? null]
	);
	return rows[0].n;
}

async function failuresCounted(email: string): Promise<number> {
	const rows = await sql<{ n: number }>('select count(*)::int as n from sign_in_failures where throttle_key = $1', [`account:${email}`]);
	return rows[0].n;
}

/** Start enrolment on the security page and read the key it shows. */
async function startEnrolment(base: string, cookie: string): Promise<{ secret: string; html: string }> {
	const begin = await postForm(base, '/account/security?/begin', {}, cookie);
	expect(begin.status).toBe(303);
	const page = await get(base, '/account/security', cookie);
	expect(page.status).toBe(200);
	const html = await page.text();
	return { secret: secretFromSecurityPage(html), html };
}

/** Enrol a person completely through the forms (with the code of now + `stepsAhead` steps); returns the secret. */
async function enrol(base: string, cookie: string, stepsAhead = 0): Promise<string> {
	const { secret } = await startEnrolment(base, cookie);
	const confirm = await postForm(
		base,
		'/account/security?/confirm',
		{ password: DEMO_PASSWORD, code: totpCode(secret, stepsAhead) },
		cookie
	);
	expect(confirm.status, await confirm.clone().text()).toBe(303);
	return secret;
}

/** A 6-digit code that is none of the codes the server would accept now (±1 step). */
function wrongCode(secret: string): string {
	const valid = new Set([-1, 0, 1].map((s) => totpCode(secret, s)));
	for (let n = 0; ; n++) {
		const code = String(123456 + n * 7919)
			.padStart(6, '0')
			.slice(-6);
		if (!valid.has(code)) return code;
	}
}

describe('enrolment on /account/security', () => {
	let cookie: string;
	let secret: string;

	it('shows the factor off, then a QR code and the typed key; a wrong first code leaves it off', async () => {
		cookie = await signInApi(app.url, QUALITY);
		const before = await (await get(app.url, '/account/security', cookie)).text();
		expect(before).toContain('○ Off');
		expect(before).toContain('Set up');

		const started = await startEnrolment(app.url, cookie);
		secret = started.secret;
		expect(secret).toMatch(/^[A-Z2-7]{32}$/);
		expect(started.html).toMatch(/<img[^>]+src="data:image\/svg\+xml;base64,/);
		expect(started.html).toContain('set-up started, not confirmed');

		const wrong = await postForm(app.url, '/account/security?/confirm', { password: DEMO_PASSWORD, code: wrongCode(secret) }, cookie);
		expect(wrong.status).toBe(400);
		expect(await wrong.text()).toContain(ENROL_REFUSED_TEXT);
		const row = await factorRow(QUALITY);
		expect(row.enabled_at).toBeNull();
		// The key is stored sealed, never as the text shown.
		expect(row.sealed_secret).toMatch(/^v1\./);
		expect(row.sealed_secret).not.toContain(secret);
		expect(await auditCount('auth.second_factor_setup_failed', QUALITY)).toBe(1);
	});

	it('a pending enrolment does not count: the password alone still signs in', async () => {
		const other = await signInApi(app.url, QUALITY);
		expect((await get(app.url, '/api/v1/me', other)).status).toBe(200);
	});

	it('a form field that is not six digits is refused naming the field', async () => {
		const res = await postForm(app.url, '/account/security?/confirm', { password: DEMO_PASSWORD, code: '12ab56' }, cookie);
		expect(res.status).toBe(400);
		expect(await res.text()).toContain('Enter the 6 digits your authenticator app shows');
	});

	it('a current code without the right password does not turn it on (a stolen cookie cannot enrol a phone)', async () => {
		const res = await postForm(app.url, '/account/security?/confirm', { password: 'not-the-password', code: totpCode(secret) }, cookie);
		expect(res.status).toBe(400);
		expect(await res.text()).toContain(ENROL_REFUSED_TEXT);
		expect((await factorRow(QUALITY)).enabled_at).toBeNull();
	});

	it('a current code turns it on, audits it and ends the other sessions but not this one', async () => {
		const otherSession = await signInApi(app.url, QUALITY);
		const confirm = await postForm(app.url, '/account/security?/confirm', { password: DEMO_PASSWORD, code: totpCode(secret) }, cookie);
		expect(confirm.status).toBe(303);
		expect(confirm.headers.get('location')).toBe('/account/security?changed=on');
		expect((await factorRow(QUALITY)).enabled_at).not.toBeNull();
		expect(await auditCount('auth.second_factor_enabled', QUALITY)).toBe(1);
		expect((await get(app.url, '/api/v1/me', cookie)).status).toBe(200);
		expect((await get(app.url, '/api/v1/me', otherSession)).status).toBe(401);
		const page = await (await get(app.url, '/account/security?changed=on', cookie)).text();
		expect(page).toContain('● On');
		expect(page).toContain('Your second factor is on.');
		// Once on, starting again is refused (it would replace the key without the code).
		const again = await postForm(app.url, '/account/security?/begin', {}, cookie);
		expect(again.status).toBe(409);
	});

	describe('signing in with the factor on', () => {
		let lastCode: string;

		it('the right password alone gives no session: the page asks for the code', async () => {
			const jar = new CookieJar();
			const res = await postForm(app.url, '/signin?/password', { email: QUALITY, password: DEMO_PASSWORD, redirectTo: '/' });
			jar.take(res);
			expect(res.status).toBe(303);
			expect(res.headers.get('location')).toBe('/signin?redirectTo=%2F');
			expect(jar.header()).toContain('restvolt-code-step=');
			expect(jar.header()).not.toContain('session-token');
			const stepCookie = res.headers.getSetCookie().find((c) => c.startsWith('restvolt-code-step='))!;
			expect(stepCookie).toMatch(/HttpOnly/i);
			expect(stepCookie).toMatch(/SameSite=Strict/i);
			const page = await (await get(app.url, '/signin', jar.header())).text();
			expect(page).toContain('Second step: the code from your app');
			expect(page).toContain(QUALITY);
			expect(page).not.toContain(DEMO_PASSWORD);
		});

		it('password then a current code signs in', async () => {
			lastCode = totpCode(secret, 1); // the enrolment used this step's code
			const cookie = await signInApiWithCode(app.url, QUALITY, lastCode);
			qualityCodeSession = cookie;
			const me = await get(app.url, '/api/v1/me', cookie);
			expect(me.status).toBe(200);
			expect((await me.json()).email).toBe(QUALITY);
		});

		it('a replayed code (already used) is refused, and so is a code with no password step', async () => {
			const jar = new CookieJar();
			jar.take(await postForm(app.url, '/signin?/password', { email: QUALITY, password: DEMO_PASSWORD, redirectTo: '/' }));
			const replay = await postForm(app.url, '/signin?/code', { code: lastCode, redirectTo: '/' }, jar.header());
			expect(replay.status).toBe(400);
			expect(await replay.text()).toContain(WRONG_CODE_TEXT);
			expect(replay.headers.getSetCookie().some((c) => c.startsWith('session-token') || c.includes('session-token='))).toBe(false);
			// An older step than the last accepted one is refused too.
			const older = await postForm(app.url, '/signin?/code', { code: totpCode(secret, -1), redirectTo: '/' }, jar.header());
			expect(older.status).toBe(400);

			const noStep = await postForm(app.url, '/signin?/code', { code: totpCode(secret, 1), redirectTo: '/' });
			expect(noStep.status).toBe(400);
			expect(await noStep.text()).toContain('Enter your password again');
		});

		it('a wrong code is refused, counted against the account like a wrong password, and audited', async () => {
			const before = await failuresCounted(QUALITY);
			const failedBefore = await auditCount('auth.sign_in_failed', QUALITY, 'code');
			const jar = new CookieJar();
			jar.take(await postForm(app.url, '/signin?/password', { email: QUALITY, password: DEMO_PASSWORD, redirectTo: '/' }));
			const res = await postForm(app.url, '/signin?/code', { code: wrongCode(secret), redirectTo: '/' }, jar.header());
			expect(res.status).toBe(400);
			expect(await res.text()).toContain(WRONG_CODE_TEXT);
			expect(await failuresCounted(QUALITY)).toBe(before + 1);
			expect(await auditCount('auth.sign_in_failed', QUALITY, 'code')).toBe(failedBefore + 1);
		});
	});
});

describe('the throttle counts codes', () => {
	it('after five wrong codes the next attempt waits, even with the right code, and a right password does not reset the count', async () => {
		const secret = await enrol(app.url, await signInApi(app.url, INSPECTOR));
		const jar = new CookieJar();
		jar.take(await postForm(app.url, '/signin?/password', { email: INSPECTOR, password: DEMO_PASSWORD, redirectTo: '/' }));
		for (let i = 0; i < 5; i++) {
			const res = await postForm(app.url, '/signin?/code', { code: wrongCode(secret), redirectTo: '/' }, jar.header());
			expect(res.status, `wrong code ${i + 1}`).toBe(400);
		}
		expect(await failuresCounted(INSPECTOR)).toBe(5);
		const right = await postForm(app.url, '/signin?/code', { code: totpCode(secret, 1), redirectTo: '/' }, jar.header());
		expect(right.status).toBe(429);
		expect(await right.text()).toContain(THROTTLED_TEXT);
		// Typing the password again does not start a fresh count of codes.
		const password = await postForm(app.url, '/signin?/password', { email: INSPECTOR, password: DEMO_PASSWORD, redirectTo: '/' });
		expect(password.status).toBe(429);
		expect(await failuresCounted(INSPECTOR)).toBe(5);
	});
});

describe('one code used twice at the same moment', () => {
	it('three parallel posts of one code step sign in once; a code raced between sign-in and turning off is used once', async () => {
		const cookie = await signInApi(app.url, INSPECTOR2);
		// Three steps are accepted now (previous, current, next): enrol with the previous one, then
		// use the current and the next, all well before the clock moves on.
		await withRoomInStep();
		const secret = await enrol(app.url, cookie, -1);
		const code = totpCode(secret, 0);
		const fresh = totpCode(secret, 1);
		const jar = new CookieJar();
		jar.take(await postForm(app.url, '/signin?/password', { email: INSPECTOR2, password: DEMO_PASSWORD, redirectTo: '/' }));
		const answers = await Promise.all([1, 2, 3].map(() => postForm(app.url, '/signin?/code', { code, redirectTo: '/' }, jar.header())));
		expect(answers.map((a) => a.status).sort()).toEqual([303, 400, 400]);

		// The same fresh code on two paths at once: the sign-in's code step and turning the factor off.
		const step = new CookieJar();
		step.take(await postForm(app.url, '/signin?/password', { email: INSPECTOR2, password: DEMO_PASSWORD, redirectTo: '/' }));
		const [signIn, off] = await Promise.all([
			postForm(app.url, '/signin?/code', { code: fresh, redirectTo: '/' }, step.header()),
			postForm(app.url, '/account/security?/turnOff', { password: DEMO_PASSWORD, code: fresh }, cookie)
		]);
		expect([signIn.status, off.status].sort()).toEqual([303, 400]);
		expect((await factorRow(INSPECTOR2)) === null).toBe(off.status === 303);
	});
});

describe('turning it off', () => {
	it('needs the password and a current code; then the password alone signs in again', async () => {
		const cookie = await signInApi(app.url, ADMIN);
		await withRoomInStep();
		const secret = await enrol(app.url, cookie, -1); // the previous step's code, still accepted
		const signInCode = totpCode(secret, 0);
		const offCode = totpCode(secret, 1);
		const otherSession = await signInApiWithCode(app.url, ADMIN, signInCode);

		const wrongPassword = await postForm(
			app.url,
			'/account/security?/turnOff',
			{ password: 'not-my-password', code: totpCode(secret, 1) },
			cookie
		);
		expect(wrongPassword.status).toBe(400);
		const wrongPasswordHtml = await wrongPassword.text();
		expect(wrongPasswordHtml).toContain('That password and code do not match.');
		expect(wrongPasswordHtml).not.toContain('not-my-password');
		const noCode = await postForm(app.url, '/account/security?/turnOff', { password: DEMO_PASSWORD, code: '' }, cookie);
		expect(noCode.status).toBe(400);
		const usedCode = await postForm(app.url, '/account/security?/turnOff', { password: DEMO_PASSWORD, code: signInCode }, cookie);
		expect(usedCode.status).toBe(400);
		expect((await factorRow(ADMIN))?.enabled_at).not.toBeNull();

		// A code newer than the one the sign-in used.
		const off = await postForm(app.url, '/account/security?/turnOff', { password: DEMO_PASSWORD, code: offCode }, cookie);
		expect(off.status).toBe(303);
		expect(off.headers.get('location')).toBe('/account/security?changed=off');
		expect(await factorRow(ADMIN)).toBeNull();
		expect(await auditCount('auth.second_factor_disabled', ADMIN)).toBe(1);
		expect((await get(app.url, '/api/v1/me', cookie)).status).toBe(200);
		expect((await get(app.url, '/api/v1/me', otherSession)).status).toBe(401);
		expect((await get(app.url, '/api/v1/me', await signInApi(app.url, ADMIN))).status).toBe(200);
	});
});

/**
 * When less than `ms` of the current 30-second step is left, wait for the next one: a test that
 * uses the previous step's code must use it before the clock moves on (then it is two steps old).
 */
async function withRoomInStep(ms = 8_000): Promise<void> {
	const left = 30_000 - (Date.now() % 30_000);
	if (left < ms) await new Promise((r) => setTimeout(r, left + 200));
}

describe('the site requires a second factor (RESTVOLT_REQUIRE_TOTP=on)', () => {
	let strict: RunningApp;

	beforeAll(async () => {
		strict = await startApp({ databaseUrl: db.url, env: { RESTVOLT_REQUIRE_TOTP: 'on' } });
	});
	afterAll(async () => {
		await strict?.stop();
	});

	it('sends a quality manager without one to enrolment and closes every other page and the API to their cookie', async () => {
		const cookie = await signInApi(strict.url, QUALITY2);
		// Where signing in lands (the front door) sends them straight to enrolment.
		const home = await get(strict.url, '/', cookie);
		expect(home.status).toBe(303);
		expect(home.headers.get('location')).toBe('/account/security');
		for (const path of ['/review', '/lots', '/parts', '/models']) {
			const res = await get(strict.url, path, cookie);
			expect(res.headers.get('location'), path).toBe('/account/security');
		}
		const page = await get(strict.url, '/account/security', cookie);
		expect(page.status).toBe(200);
		expect(await page.text()).toContain('This site asks quality managers and administrators');

		for (const path of ['/api/v1/me', '/api/v1/lots']) {
			const api = await get(strict.url, path, cookie);
			expect(api.status, path).toBe(403);
			expect((await api.json()).error.code).toBe('second_factor_required');
		}
		// A form post elsewhere is turned away too.
		const post = await postForm(strict.url, '/lots/new', { po_number: 'x' }, cookie);
		expect(post.headers.get('location')).toBe('/account/security');
	});

	it('leaves API tokens, other roles and people already enrolled alone', async () => {
		const token = await tokenFor(db.url, QUALITY2);
		expect((await fetch(`${strict.url}/api/v1/me`, { headers: { authorization: `Bearer ${token}` } })).status).toBe(200);
		const buyer = await signInApi(strict.url, BUYER);
		expect((await get(strict.url, '/lots', buyer)).status).toBe(200);
		expect((await get(strict.url, '/api/v1/me', buyer)).status).toBe(200);
	});

	it('opens everything once the quality manager has enrolled', async () => {
		const cookie = await signInApi(strict.url, QUALITY2);
		await enrol(strict.url, cookie);
		expect((await get(strict.url, '/review', cookie)).status).toBe(200);
		expect((await get(strict.url, '/api/v1/me', cookie)).status).toBe(200);
	});
});

describe('a lost phone', () => {
	it('an administrator removes someone else’s second factor on the People page; their sessions end, the password signs in again', async () => {
		expect((await factorRow(QUALITY))?.enabled_at).toBeTruthy(); // turned on in the first describe
		const qualitySession = qualityCodeSession;
		expect((await get(app.url, '/api/v1/me', qualitySession)).status).toBe(200);
		const admin = await signInApi(app.url, ADMIN);
		const people = await (await get(app.url, '/admin/users', admin)).text();
		expect(people).toContain('+ code from an app');
		const quality = (await sql<{ id: string }>('select id from "user" where email = $1', [QUALITY]))[0].id;
		const adminId = (await sql<{ id: string }>('select id from "user" where email = $1', [ADMIN]))[0].id;

		const own = await postForm(app.url, '/admin/users?/removeSecondFactor', { userId: adminId }, admin);
		expect(own.status).toBe(400);

		const res = await postForm(app.url, '/admin/users?/removeSecondFactor', { userId: quality }, admin);
		expect(res.status).toBe(200);
		expect(await factorRow(QUALITY)).toBeNull();
		expect(await auditCount('auth.second_factor_removed', ADMIN)).toBe(1);
		expect((await get(app.url, '/api/v1/me', qualitySession)).status).toBe(401);
		expect((await get(app.url, '/api/v1/me', await signInApi(app.url, QUALITY))).status).toBe(200);
		// Nothing left to remove.
		expect((await postForm(app.url, '/admin/users?/removeSecondFactor', { userId: quality }, admin)).status).toBe(400);
	});
});
