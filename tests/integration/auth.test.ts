/**
 * Sign-in, sessions, throttling, API tokens, e-mailed supplier links and password resets,
 * against the built app (`node build`) on a fresh copy of the seeded demo database.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startApp, type RunningApp } from '../helpers/app';
import { freshDatabase, withClient } from '../helpers/db';
import { waitForMail } from '../helpers/mail';
import { CookieJar, DEMO_PASSWORD, postForm, runTokenCommand, signInApi, signInLinkFor, tokenFor } from '../helpers/auth';

const BUYER = 'buyer@kestrel-mobility.example';
const INSPECTOR = 'inspector@kestrel-mobility.example';
const QUALITY2 = 'quality2@kestrel-mobility.example';
const ADMIN = 'admin@kestrel-mobility.example';
const SUPPLIER = 'supplier@voltaria-cells.example';
const WRONG_PASSWORD_TEXT = 'That e-mail address and password do not match.';
const THROTTLED_TEXT = 'Too many attempts';

let app: RunningApp;
let db: { url: string; drop: () => Promise<void> };

beforeAll(async () => {
	db = await freshDatabase('auth');
	app = await startApp({ databaseUrl: db.url });
});

afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

const get = (path: string, headers: Record<string, string> = {}) => fetch(`${app.url}${path}`, { redirect: 'manual', headers });
const me = (headers: Record<string, string>) => get('/api/v1/me', headers);
/** The lot evaluation endpoint checks a bearer token in its own statement (auth.ts): same refusals as everywhere. */
async function evaluation(headers: Record<string, string>) {
	const lotId = await withClient(db.url, async (c) => (await c.query('select id from lots order by created_at limit 1')).rows[0].id);
	return get(`/api/v1/lots/${lotId}/evaluation`, headers);
}
const passwordPost = (email: string, password: string) => postForm(app.url, '/signin?/password', { email, password, redirectTo: '/' });

async function auditCount(action: string, email: string): Promise<number> {
	return withClient(db.url, async (c) => {
		const r = await c.query('select count(*)::int as n from audit_events where action = $1 and actor_email = $2', [action, email]);
		return r.rows[0].n as number;
	});
}

async function userId(email: string): Promise<string> {
	return withClient(db.url, async (c) => (await c.query('select id from "user" where email = $1', [email])).rows[0].id);
}

describe('staff password sign-in', () => {
	it('signs in through the form, puts role and organisation on the session, and audits it', async () => {
		const cookie = await signInApi(app.url, BUYER, DEMO_PASSWORD);
		const res = await me({ cookie });
		expect(res.status).toBe(200);
		const body = await res.json();
		expect(body).toMatchObject({ email: BUYER, role: 'buyer', auth_method: 'session' });
		expect(body.organisation_id).toMatch(/^[0-9a-f-]{36}$/);
		// The front door sends a buyer to the lots.
		const home = await get('/', { cookie });
		expect(home.status).toBe(303);
		expect(home.headers.get('location')).toBe('/lots');
		expect(await auditCount('auth.sign_in', BUYER)).toBe(1);
	});

	it('refuses a wrong password with a plain message and no session', async () => {
		const res = await passwordPost(INSPECTOR, 'not-the-password');
		expect(res.status).toBe(400);
		expect(res.headers.getSetCookie().some((c) => c.includes('session-token='))).toBe(false);
		expect(await res.text()).toContain(WRONG_PASSWORD_TEXT);
		expect(await auditCount('auth.sign_in_failed', INSPECTOR)).toBe(1);
	});

	it('answers an unknown account exactly like a wrong password (no enumeration)', async () => {
		const res = await passwordPost('nobody@kestrel-mobility.example', 'whatever-it-is');
		expect(res.status).toBe(400);
		expect(await res.text()).toContain(WRONG_PASSWORD_TEXT);
	});

	it('refuses a cross-site form post (SvelteKit origin check)', async () => {
		const res = await fetch(`${app.url}/signin?/password`, {
			method: 'POST',
			redirect: 'manual',
			headers: { origin: 'http://evil.example', 'content-type': 'application/x-www-form-urlencoded' },
			body: new URLSearchParams({ email: BUYER, password: DEMO_PASSWORD })
		});
		expect(res.status).toBe(403);
	});

	it("keeps Auth.js's own POST endpoints closed, so nothing skips the throttle", async () => {
		const res = await postForm(app.url, '/auth/callback/credentials', { email: BUYER, password: DEMO_PASSWORD });
		expect(res.status).toBe(404);
	});

	it('throttles an account after 5 failures, even with the right password, with the same message for unknown accounts', async () => {
		for (let i = 0; i < 5; i++) expect((await passwordPost(QUALITY2, `wrong-${i}`)).status).toBe(400);
		const blocked = await passwordPost(QUALITY2, DEMO_PASSWORD);
		expect(blocked.status).toBe(429);
		expect(await blocked.text()).toContain(THROTTLED_TEXT);

		const ghost = 'ghost@kestrel-mobility.example';
		for (let i = 0; i < 5; i++) await passwordPost(ghost, `wrong-${i}`);
		const ghostBlocked = await passwordPost(ghost, 'anything-at-all');
		expect(ghostBlocked.status).toBe(429);
		expect(await ghostBlocked.text()).toContain(THROTTLED_TEXT);
		// Other accounts are not affected by one account's failures.
		expect(await signInApi(app.url, INSPECTOR)).toContain('session-token');
	});

	it('signs out: the session cookie is cleared and the sign-out is audited', async () => {
		const jar = new CookieJar();
		const cookie = await signInApi(app.url, ADMIN);
		for (const pair of cookie.split('; ')) jar.cookies.set(pair.split('=')[0], pair.slice(pair.indexOf('=') + 1));
		const res = await postForm(app.url, '/signout', {}, jar.header());
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toBe('/signin?signed-out');
		jar.take(res);
		expect(jar.header()).not.toContain('session-token');
		expect((await me({ cookie: jar.header() })).status).toBe(401);
		expect(await auditCount('auth.sign_out', ADMIN)).toBe(1);
	});
});

describe('API tokens', () => {
	it('`npm run token` prints a token on its last line that authenticates the API as that user', async () => {
		const token = await tokenFor(db.url, INSPECTOR);
		expect(token).toMatch(/^rv_[\w-]{43}$/);
		const res = await me({ authorization: `Bearer ${token}` });
		expect(res.status).toBe(200);
		expect(await res.json()).toMatchObject({ email: INSPECTOR, role: 'inspector', auth_method: 'token' });
		// Stored hashed, with the last use noted.
		const row = await withClient(
			db.url,
			async (c) => (await c.query('select token_hash, last_used_at from api_tokens where prefix = $1', [token.slice(0, 10)])).rows[0]
		);
		expect(row.token_hash).not.toContain(token);
		expect(row.token_hash).toMatch(/^[0-9a-f]{64}$/);
		expect(row.last_used_at).not.toBeNull();
	});

	it('`npm run token` exits non-zero with a message for an unknown e-mail address', async () => {
		const result = await runTokenCommand(db.url, ['--email', 'nobody@nowhere.example']);
		expect(result.code).not.toBe(0);
		expect(result.stderr).toContain('No user with the e-mail address nobody@nowhere.example');
		expect(result.stdout.trim()).toBe('');
	});

	it('refuses anonymous calls, unknown tokens and a token revoked on the admin page (401)', async () => {
		expect((await me({})).status).toBe(401);
		expect((await me({ authorization: 'Bearer rv_not-a-token' })).status).toBe(401);

		expect((await evaluation({ authorization: 'Bearer rv_not-a-token' })).status).toBe(401);
		const token = await tokenFor(db.url, BUYER);
		expect((await me({ authorization: `Bearer ${token}` })).status).toBe(200);
		expect((await evaluation({ authorization: `Bearer ${token}` })).status).toBe(200);
		const tokenId = await withClient(
			db.url,
			async (c) => (await c.query('select id from api_tokens where prefix = $1', [token.slice(0, 10)])).rows[0].id
		);
		const admin = await signInApi(app.url, ADMIN);
		const revoke = await postForm(app.url, '/admin/tokens?/revoke', { tokenId }, admin);
		expect(revoke.status).toBe(200);
		const res = await me({ authorization: `Bearer ${token}` });
		expect(res.status).toBe(401);
		expect((await res.json()).error.code).toBe('unauthenticated');
		expect((await evaluation({ authorization: `Bearer ${token}` })).status).toBe(401);
		expect(await auditCount('token.revoked', ADMIN)).toBe(1);
		expect(await auditCount('token.created', 'command line')).toBeGreaterThanOrEqual(2);
	});

	it('lets only an admin create tokens on the admin page, shown once', async () => {
		const admin = await signInApi(app.url, ADMIN);
		const res = await postForm(app.url, '/admin/tokens?/create', { userId: await userId(QUALITY2), label: 'bench bridge' }, admin);
		expect(res.status).toBe(200);
		const token = /rv_[\w-]{43}/.exec(await res.text())?.[0];
		expect(token).toBeDefined();
		expect(await (await me({ authorization: `Bearer ${token}` })).json()).toMatchObject({ role: 'quality' });
		// The list shows the prefix only.
		const list = await (await get('/admin/tokens', { cookie: admin })).text();
		expect(list).toContain(token!.slice(0, 10));
		expect(list).not.toContain(token);

		const buyer = await signInApi(app.url, BUYER);
		const refused = await postForm(app.url, '/admin/tokens?/create', { userId: await userId(BUYER), label: 'sneaky' }, buyer);
		expect(refused.status).toBe(403);
	});
});

describe('supplier e-mail link', () => {
	it('mails a one-time link that signs the supplier in; the portal is for suppliers only', async () => {
		const since = Date.now() - 1000;
		const ask = await postForm(app.url, '/signin?/link', { email: SUPPLIER, redirectTo: '' });
		expect(ask.status).toBe(303);
		expect(ask.headers.get('location')).toBe('/signin/link-sent');
		const link = await signInLinkFor(SUPPLIER, since);
		expect(new URL(link).origin).toBe(app.url);

		const jar = new CookieJar();
		const follow = await fetch(link, { redirect: 'manual' });
		jar.take(follow);
		expect(follow.status).toBe(302);
		expect(new URL(follow.headers.get('location')!, app.url).pathname).toBe('/portal');
		const body = await (await me({ cookie: jar.header() })).json();
		expect(body).toMatchObject({ email: SUPPLIER, role: 'supplier', auth_method: 'session' });
		expect((await get('/portal', { cookie: jar.header() })).status).toBe(200);
		// A supplier asking for staff pages is sent back to the portal.
		const staffPage = await get('/lots', { cookie: jar.header() });
		expect(staffPage.status).toBe(303);
		expect(staffPage.headers.get('location')).toBe('/portal');
		expect(await auditCount('auth.sign_in', SUPPLIER)).toBe(1);

		// The link works once.
		const again = await fetch(link, { redirect: 'manual' });
		expect(again.headers.get('location')).toContain('/signin?error=Verification');
	});

	it('keeps staff out of the portal and anonymous visitors out of everything', async () => {
		const buyer = await signInApi(app.url, BUYER);
		const res = await get('/portal', { cookie: buyer });
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toBe('/');
		const anonymous = await get('/portal');
		expect(anonymous.headers.get('location')).toBe('/signin?redirectTo=%2Fportal');
	});

	it('sends no link to staff or unknown addresses, and says the same thing', async () => {
		const since = Date.now();
		for (const email of [BUYER, 'unknown@voltaria-cells.example']) {
			const res = await postForm(app.url, '/signin?/link', { email, redirectTo: '' });
			expect(res.headers.get('location')).toBe('/signin/link-sent');
		}
		await new Promise((r) => setTimeout(r, 500));
		const { readMail } = await import('../helpers/mail');
		const stray = (await readMail()).filter(
			(m) => Number(m.id.split('-')[0]) >= since && [BUYER, 'unknown@voltaria-cells.example'].some((a) => m.envelope.to.includes(a))
		);
		expect(stray).toHaveLength(0);
	});
});

describe('admin changes and password links', () => {
	it('audits a role change, which takes effect on the next request', async () => {
		const admin = await signInApi(app.url, ADMIN);
		const inspector2 = 'inspector2@kestrel-mobility.example';
		const session = await signInApi(app.url, inspector2);
		const res = await postForm(app.url, '/admin/users?/role', { userId: await userId(inspector2), role: 'quality' }, admin);
		expect(res.status).toBe(200);
		expect(await (await me({ cookie: session })).json()).toMatchObject({ role: 'quality' });
		const details = await withClient(
			db.url,
			async (c) => (await c.query("select details from audit_events where action = 'user.role_changed'")).rows
		);
		expect(details).toEqual([{ details: expect.objectContaining({ email: inspector2, from: 'inspector', to: 'quality' }) }]);
		// Staff roles cannot move into a supplier organisation by a role change.
		const bad = await postForm(app.url, '/admin/users?/role', { userId: await userId(inspector2), role: 'supplier' }, admin);
		expect(bad.status).toBe(400);
	});

	it('a deactivated person can do nothing: session, token and password all refused', async () => {
		const admin = await signInApi(app.url, ADMIN);
		const person = 'quality@kestrel-mobility.example';
		const session = await signInApi(app.url, person);
		const token = await tokenFor(db.url, person);
		expect((await evaluation({ authorization: `Bearer ${token}` })).status).toBe(200);
		const res = await postForm(app.url, '/admin/users?/active', { userId: await userId(person), active: 'false' }, admin);
		expect(res.status).toBe(200);
		expect((await me({ cookie: session })).status).toBe(401);
		expect((await me({ authorization: `Bearer ${token}` })).status).toBe(401);
		expect((await evaluation({ authorization: `Bearer ${token}` })).status).toBe(401);
		expect((await passwordPost(person, DEMO_PASSWORD)).status).toBe(400);
		expect(await auditCount('user.deactivated', ADMIN)).toBe(1);
	});

	it('invites staff with a set-password link that works once, then the password signs in', async () => {
		const admin = await signInApi(app.url, ADMIN);
		const ownOrg = await withClient(db.url, async (c) => (await c.query("select id from organisations where kind = 'own'")).rows[0].id);
		const email = 'new.inspector@kestrel-mobility.example';
		const since = Date.now() - 1000;
		const invite = await postForm(
			app.url,
			'/admin/users?/invite',
			{ email, name: 'Nia Newcomer', role: 'inspector', organisationId: ownOrg },
			admin
		);
		expect(invite.status).toBe(200);
		const [mail] = await waitForMail((m) => m.envelope.to.includes(email) && Number(m.id.split('-')[0]) >= since);
		const path = new URL(/https?:\/\/\S+\/signin\/reset\/[\w-]+/.exec(mail.text)![0]).pathname;
		const newPassword = 'a calm new password 42';
		const set = await postForm(app.url, path, { password: newPassword, confirm: newPassword });
		expect(set.status).toBe(303);
		expect(set.headers.get('location')).toBe('/signin?password-set');
		expect(await (await me({ cookie: await signInApi(app.url, email, newPassword) })).json()).toMatchObject({ role: 'inspector' });
		const reuse = await postForm(app.url, path, { password: 'another password 1234', confirm: 'another password 1234' });
		expect(reuse.status).toBe(410);
		expect(await auditCount('user.invited', ADMIN)).toBe(1);
	});

	it('resets a staff password by e-mailed link and stores only its hash', async () => {
		const since = Date.now() - 1000;
		const res = await postForm(app.url, '/signin/forgot', { email: BUYER });
		expect(res.status).toBe(200);
		expect(await res.text()).toContain('If this address belongs to a staff account');
		const [mail] = await waitForMail(
			(m) => m.envelope.to.includes(BUYER) && m.subject.includes('Reset') && Number(m.id.split('-')[0]) >= since
		);
		const token = /\/signin\/reset\/([\w-]+)/.exec(mail.text)![1];
		const stored = await withClient(
			db.url,
			async (c) => (await c.query('select token_hash from password_resets where token_hash = $1', [token])).rowCount
		);
		expect(stored).toBe(0);
		const set = await postForm(app.url, `/signin/reset/${token}`, { password: 'buyer has a new one 7', confirm: 'buyer has a new one 7' });
		expect(set.status).toBe(303);
		await expect(signInApi(app.url, BUYER, DEMO_PASSWORD)).rejects.toThrow();
		expect(await signInApi(app.url, BUYER, 'buyer has a new one 7')).toContain('session-token');
	});
});

describe('per-address throttle (last: it blocks this address for the rest of the file)', () => {
	it('blocks every account from one address after 20 failures, with the same message', async () => {
		for (let i = 0; i < 25; i++) {
			const res = await passwordPost(`spray-${i}@kestrel-mobility.example`, 'guess');
			if (res.status === 429) break;
		}
		const res = await passwordPost(ADMIN, DEMO_PASSWORD);
		expect(res.status).toBe(429);
		expect(await res.text()).toContain(THROTTLED_TEXT);
	});
});
