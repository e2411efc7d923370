/**
 * PostgreSQL stopped or restarting (issue 18, item 7): every API route answers 503
 * {"error":{"code":"database_unavailable"}} — also the health route (not wrapped in api()) and
 * requests whose session or token the hooks cannot check — and pages answer a friendly 503 page
 * without internals; a read in flight when the database restarts is retried once and succeeds; a
 * request that meets a stopped database which comes back within the connect retry succeeds; after
 * the restart everything works again with the same cookie and token.
 *
 * This stops the SHARED test cluster; integration files run one after another, never alongside.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import pg from 'pg';
import { restartPostgres, stopPostgres } from '../../scripts/lib/pg.mjs';
import { startApp, type RunningApp } from '../helpers/app';
import { signInApi, tokenFor } from '../helpers/auth';
import { freshDatabase, withClient, type FreshDatabase } from '../helpers/db';
import { testEnv } from '../helpers/env';
import { waitUntil } from './decisions-fixtures';

/** Wide enough that the test can start PostgreSQL again inside it. */
const CONNECT_RETRY_MS = 6000;

let app: RunningApp;
let db: FreshDatabase;
let token: string;
let cookie: string;
let lotId: string;
let newLot: Record<string, unknown>;

const cluster = () => ({ bin: testEnv().pgBin, dataDir: testEnv().pgData });

beforeAll(async () => {
	db = await freshDatabase('database_down');
	app = await startApp({ databaseUrl: db.url, env: { DB_CONNECT_RETRY_MS: String(CONNECT_RETRY_MS), WORKERS: 'off' } });
	token = await tokenFor(db.url, 'buyer@kestrel-mobility.example');
	cookie = await signInApi(app.url, 'buyer@kestrel-mobility.example');
	const facts = await withClient(db.url, async (c) => {
		const lot = await c.query(`select id from lots order by lot_code limit 1`);
		const part = await c.query(`select id, supplier_id from parts where chemistry = 'NMC' order by part_number limit 1`);
		return { lotId: lot.rows[0].id as string, part: part.rows[0] };
	});
	lotId = facts.lotId;
	newLot = {
		po_number: 'PO-DB-DOWN',
		supplier_id: facts.part.supplier_id,
		part_id: facts.part.id,
		quantity: 100,
		declared_soc: 0.3,
		transport: 'road',
		un_number: 'UN3480'
	};
}, 120_000);

afterAll(async () => {
	// Never leave the shared cluster stopped for the next file.
	if (!(await clusterIsUp())) restartPostgres(cluster());
	await app?.stop();
	await db?.drop();
});

async function clusterIsUp(): Promise<boolean> {
	try {
		await withClient(`${testEnv().pgUrl}/postgres`, (c) => c.query('select 1'));
		return true;
	} catch {
		return false;
	}
}

interface Answer {
	status: number;
	type: string;
	text: string;
}

async function send(
	path: string,
	init: { method?: string; auth?: 'token' | 'cookie' | 'none'; body?: unknown; html?: boolean } = {}
): Promise<Answer> {
	const headers: Record<string, string> = { accept: init.html ? 'text/html' : 'application/json' };
	if (init.auth === 'token') headers.authorization = `Bearer ${token}`;
	if (init.auth === 'cookie') Object.assign(headers, { cookie, origin: app.url });
	if (init.body !== undefined) headers['content-type'] = 'application/json';
	const res = await fetch(`${app.url}${path}`, {
		method: init.method ?? 'GET',
		headers,
		body: init.body === undefined ? undefined : JSON.stringify(init.body),
		redirect: 'manual'
	});
	return { status: res.status, type: res.headers.get('content-type') ?? '', text: await res.text() };
}

/** Routes of every kind: wrapped in api() or not, token or cookie, read or write, hook or handler failing. */
const apiCalls = () =>
	[
		['GET /api/v1/lots (token)', () => send('/api/v1/lots', { auth: 'token' })],
		['GET /api/v1/lots (cookie)', () => send('/api/v1/lots', { auth: 'cookie' })],
		['POST /api/v1/lots (token)', () => send('/api/v1/lots', { method: 'POST', auth: 'token', body: newLot })],
		['POST /api/v1/lots (cookie)', () => send('/api/v1/lots', { method: 'POST', auth: 'cookie', body: newLot })],
		['GET evaluation (token checked in the route itself)', () => send(`/api/v1/lots/${lotId}/evaluation`, { auth: 'token' })],
		['GET /api/v1/health (not wrapped in api())', () => send('/api/v1/health')],
		['GET /api/v1/me (cookie)', () => send('/api/v1/me', { auth: 'cookie' })],
		['GET an unknown API path (token)', () => send('/api/v1/nothing-here', { auth: 'token' })]
	] as const;

function expectUnavailableJson(what: string, answer: Answer) {
	expect(answer.status, `${what}: ${answer.text.slice(0, 300)}`).toBe(503);
	expect(answer.type, what).toMatch(/^application\/json/);
	expect(JSON.parse(answer.text), what).toMatchObject({
		error: { code: 'database_unavailable', message: expect.stringMatching(/database/i) }
	});
}

function expectFriendlyPage(what: string, answer: Answer) {
	expect(answer.status, `${what}: ${answer.text.slice(0, 300)}`).toBe(503);
	expect(answer.type, what).toMatch(/^text\/html/);
	expect(answer.text, what).toMatch(/Database unavailable/);
	expect(answer.text, what).toMatch(/try again/i);
	// No internals: no stack frames, driver error names or SQL.
	expect(answer.text, what).not.toMatch(/ECONNREFUSED|\bat [\w.<>]+ \(|node_modules|select |Error:/);
}

const lotCount = () =>
	withClient(db.url, async (c) => Number((await c.query(`select count(*) as n from lots where po_number = 'PO-DB-DOWN'`)).rows[0].n));

describe('PostgreSQL stopped', () => {
	it('works before the stop', async () => {
		expect((await send('/api/v1/lots', { auth: 'token' })).status).toBe(200);
		expect((await send('/api/v1/lots', { auth: 'cookie' })).status).toBe(200);
		expect((await send('/lots', { auth: 'cookie', html: true })).status).toBe(200);
	});

	it('answers 503 database_unavailable on every kind of API route and a friendly 503 page on pages', async () => {
		stopPostgres(cluster());
		expect(await clusterIsUp()).toBe(false);
		const answers = await Promise.all(apiCalls().map(async ([what, call]) => [what, await call()] as const));
		for (const [what, answer] of answers) expectUnavailableJson(what, answer);

		// A page whose hooks fail (the cookie's session cannot be checked) …
		expectFriendlyPage('GET /lots (cookie)', await send('/lots', { auth: 'cookie', html: true }));
		// … one whose load fails (anonymous: no hook needs the database) …
		expectFriendlyPage('GET a password-reset page', await send('/signin/reset/some-token-that-is-not-stored', { html: true }));
		// … and a form action that fails (the password sign-in).
		const signIn = await fetch(`${app.url}/signin?/password`, {
			method: 'POST',
			redirect: 'manual',
			headers: { origin: app.url, accept: 'text/html', 'content-type': 'application/x-www-form-urlencoded' },
			body: new URLSearchParams({ email: 'buyer@kestrel-mobility.example', password: 'restvolt-demo-2026', redirectTo: '/' })
		});
		expectFriendlyPage('POST /signin?/password', {
			status: signIn.status,
			type: signIn.headers.get('content-type') ?? '',
			text: await signIn.text()
		});
		expect(app.output()).not.toMatch(/Unhandled|uncaught/i);
	}, 120_000);

	it('works again after the restart, with the same token and cookie; nothing was stored while it was down', async () => {
		restartPostgres(cluster());
		expect(await lotCount()).toBe(0);
		expect((await send('/api/v1/lots', { auth: 'token' })).status).toBe(200);
		expect((await send('/api/v1/lots', { auth: 'cookie' })).status).toBe(200);
		expect((await send('/lots', { auth: 'cookie', html: true })).status).toBe(200);
		expect((await send('/api/v1/health')).status).toBe(200);
		expect((await send(`/api/v1/lots/${lotId}/evaluation`, { auth: 'token' })).status).toBe(200);
		const created = await send('/api/v1/lots', { method: 'POST', auth: 'token', body: newLot });
		expect(created.status, created.text).toBe(201);
		expect(await lotCount()).toBe(1);
	}, 60_000);
});

describe('PostgreSQL coming back within the retry', () => {
	it('a request that met a stopped database succeeds when the database is back before its one connect retry', async () => {
		stopPostgres(cluster());
		const started = Date.now();
		const pending = send('/api/v1/lots', { auth: 'token' });
		// The first connect fails at once; the retry waits CONNECT_RETRY_MS. Start within it.
		await new Promise((r) => setTimeout(r, 500));
		restartPostgres(cluster());
		expect(Date.now() - started).toBeLessThan(CONNECT_RETRY_MS);
		const answer = await pending;
		expect(answer.status, answer.text.slice(0, 300)).toBe(200);
	}, 60_000);

	it('a read in flight when PostgreSQL restarts is retried once and answers 200', async () => {
		// Hold the lots table so the read blocks inside PostgreSQL, then restart the cluster under it.
		const holder = new pg.Client({ connectionString: db.url });
		await holder.connect();
		holder.on('error', () => {}); // the restart ends this connection too
		await holder.query('begin');
		await holder.query('lock table lots in access exclusive mode');
		const pending = send(`/api/v1/lots/${lotId}`, { auth: 'token' });
		await waitUntil(
			() =>
				withClient(`${testEnv().pgUrl}/postgres`, async (c) => {
					const { rows } = await c.query(
						`select 1 from pg_stat_activity where datname = $1 and wait_event_type = 'Lock' and usename = 'restvolt_app'`,
						[db.name]
					);
					return rows.length > 0;
				}),
			20_000,
			'the read to block on the lots lock'
		);
		restartPostgres(cluster());
		const answer = await pending;
		expect(answer.status, answer.text.slice(0, 300)).toBe(200);
		expect(JSON.parse(answer.text).id).toBe(lotId);
		expect(app.output()).toMatch(/database unreachable, trying once more/);
		await holder.end().catch(() => {});
	}, 60_000);
});
