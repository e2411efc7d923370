/**
 * The mail outbox under faults, with a private SMTP peer the test stops and starts:
 *  - the relay is down while decisions are made → every notice arrives exactly once after it is back;
 *  - the app is killed (SIGKILL) with notices pending and restarted → each is sent exactly once;
 *  - two app processes poll the same job queue → each notice is sent exactly once;
 *  - two quality managers override the same held lot at once → exactly one wins, the other gets 409;
 *  - a notice that used up its attempts is 'failed' on the admin outbox page, and "retry now" sends it once.
 * "Exactly once" is checked by counting the deterministic Message-ID <notice-{id}@restvolt.local>.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { join } from 'node:path';
import { freePort } from '../../scripts/lib/proc.mjs';
import { startApp, type RunningApp } from '../helpers/app';
import { DEMO_PASSWORD, signInApi, tokenFor } from '../helpers/auth';
import { freshDatabase, withClient } from '../helpers/db';
import { testEnv } from '../helpers/env';
import { startPrivatePeer, type PrivatePeer } from '../helpers/mail';
import { measuredLot, mailsForNotice, waitUntil } from './decisions-fixtures';
import { call, type Caller } from './readings-fixtures';

let db: Awaited<ReturnType<typeof freshDatabase>>;
let smtpPort: number;
let httpPort: number;
let mailDir: string;
let peer: PrivatePeer | null = null;
let app: RunningApp | null = null;

// A short poll; the retries wait graphile-worker's own backoff (exp(attempts) seconds), as in production.
const OUTBOX_ENV = { OUTBOX_POLL_MS: '150', OUTBOX_MAX_ATTEMPTS: '50' };

const start = (env: Record<string, string> = {}) => startApp({ databaseUrl: db.url, smtpPort, env: { ...OUTBOX_ENV, ...env } });
const startPeer = async () => (peer = await startPrivatePeer(smtpPort, httpPort, mailDir));
const stopPeer = async () => {
	await peer?.stop();
	peer = null;
};

async function callers(base: string) {
	const as = async (email: string): Promise<Caller> => ({ base, token: await tokenFor(db.url, email) });
	return { buyer: await as('buyer@kestrel-mobility.example'), inspector: await as('inspector@kestrel-mobility.example') };
}

const noticeRows = (ids: string[]) =>
	withClient(
		db.url,
		async (c) => (await c.query('select id, status, attempts, last_error, message_id from notices where id = any($1::uuid[])', [ids])).rows
	);

/**
 * The outbox rows a submit wrote: the supplier's notice for a lot released at once, quality's
 * alert for a lot put on hold for review (the supplier hears of it only after quality decides).
 */
const outboxOf = (lotId: string) =>
	withClient(db.url, async (c) => (await c.query('select id from notices where lot_id = $1', [lotId])).rows.map((r) => r.id as string));

/** Wait until every notice is marked sent, then give the worker time to (wrongly) send again. */
async function expectEachDeliveredOnce(ids: string[], peerUrl: string) {
	await waitUntil(async () => (await noticeRows(ids)).every((r) => r.status === 'sent'), 30_000, 'notices marked sent');
	await new Promise((r) => setTimeout(r, 1500));
	for (const id of ids) expect((await mailsForNotice(id, peerUrl)).length, `notice ${id}`).toBe(1);
}

beforeAll(async () => {
	db = await freshDatabase('outbox_faults', { demo: false });
	[smtpPort, httpPort] = [await freePort(), await freePort()];
	mailDir = join(testEnv().scratch, `outbox-faults-${Date.now()}`);
}, 60_000);

afterAll(async () => {
	await app?.stop();
	await stopPeer();
	await db?.drop();
});

describe('outbox faults', () => {
	it('keeps notices while the SMTP relay is down and delivers each exactly once when it is back', async () => {
		app = await start(); // the relay is not running yet
		const { buyer, inspector } = await callers(app.url);
		const ids: string[] = [];
		for (const scenario of ['accept', 'hold', 'safety'] as const) {
			const lot = await measuredLot(buyer, inspector, scenario);
			const res = await call(inspector, `/api/v1/lots/${lot.id}/submit`, { method: 'POST' });
			expect(res.status).toBe(201);
			const written = await outboxOf(lot.id);
			expect(written).toHaveLength(1);
			ids.push(...written);
		}
		// Several attempts fail while the relay is down; nothing is lost or given up.
		await waitUntil(async () => (await noticeRows(ids)).every((r) => r.attempts >= 2), 20_000, 'failed attempts');
		const down = await noticeRows(ids);
		expect(down.every((r) => r.status === 'pending' && r.last_error)).toBe(true);
		await startPeer();
		await expectEachDeliveredOnce(ids, peer!.httpUrl);
		const sent = await noticeRows(ids);
		expect(sent.every((r) => r.message_id === `<notice-${r.id}@restvolt.local>`)).toBe(true);
	});

	it('sends notices left pending by a killed app exactly once after the restart', async () => {
		await stopPeer();
		const { buyer, inspector } = await callers(app!.url);
		const ids: string[] = [];
		for (const scenario of ['hold', 'accept'] as const) {
			const lot = await measuredLot(buyer, inspector, scenario);
			expect((await call(inspector, `/api/v1/lots/${lot.id}/submit`, { method: 'POST' })).status).toBe(201);
			ids.push(...(await outboxOf(lot.id)));
		}
		await waitUntil(async () => (await noticeRows(ids)).every((r) => r.attempts >= 1), 20_000, 'a failed attempt');
		await app!.kill(); // SIGKILL: no shutdown hook runs
		expect((await noticeRows(ids)).every((r) => r.status === 'pending')).toBe(true);
		await startPeer();
		app = await start();
		await expectEachDeliveredOnce(ids, peer!.httpUrl);
		// A second restart sends nothing again.
		await app.stop();
		app = await start();
		await new Promise((r) => setTimeout(r, 1500));
		for (const id of ids) expect((await mailsForNotice(id, peer!.httpUrl)).length).toBe(1);
	});

	it('sends each notice exactly once with two app processes working the same queue', async () => {
		const second = await start();
		try {
			const ids: string[] = [];
			for (const [i, scenario] of (['accept', 'hold', 'accept', 'safety'] as const).entries()) {
				const { buyer, inspector } = await callers((i % 2 === 0 ? app! : second).url);
				const lot = await measuredLot(buyer, inspector, scenario);
				expect((await call(inspector, `/api/v1/lots/${lot.id}/submit`, { method: 'POST' })).status).toBe(201);
				ids.push(...(await outboxOf(lot.id)));
			}
			await expectEachDeliveredOnce(ids, peer!.httpUrl);
		} finally {
			await second.stop();
		}
	});

	it('lets exactly one of two simultaneous overrides win; the other gets 409', async () => {
		const { buyer, inspector } = await callers(app!.url);
		const lot = await measuredLot(buyer, inspector, 'hold');
		expect((await call(inspector, `/api/v1/lots/${lot.id}/submit`, { method: 'POST' })).json.status).toBe('on_hold');
		const [first, second] = await Promise.all([
			signInApi(app!.url, 'quality@kestrel-mobility.example'),
			signInApi(app!.url, 'quality2@kestrel-mobility.example')
		]);
		const post = (cookie: string, path: string, body: unknown) =>
			fetch(`${app!.url}/api/v1/lots/${lot.id}${path}`, {
				method: 'POST',
				headers: { cookie, origin: app!.url, 'content-type': 'application/json' },
				body: JSON.stringify(body)
			}).then(async (r) => ({ status: r.status, json: await r.json() }));
		// Each signer holds a signing challenge for the lot as it stands, then both sign at once.
		const challenge = async (cookie: string, decision: 'accept' | 'reject') =>
			(await post(cookie, '/decision/challenge', { decision })).json.challenge_id as string;
		const [firstChallenge, secondChallenge] = [await challenge(first, 'accept'), await challenge(second, 'reject')];
		const override = (cookie: string, decision: 'accept' | 'reject', challengeId: string) =>
			post(cookie, '/decision', {
				decision,
				...(decision === 'accept'
					? { disposition: 'release' }
					: { disposition: 'return_to_supplier', due_date: new Date(Date.now() + 14 * 86_400_000).toISOString().slice(0, 10) }),
				reason: `Decided ${decision} in the concurrency test`,
				password: DEMO_PASSWORD,
				challenge_id: challengeId
			});
		const results = await Promise.all([override(first, 'accept', firstChallenge), override(second, 'reject', secondChallenge)]);
		const statuses = results.map((r) => r.status).sort();
		expect(statuses).toEqual([200, 409]);
		const loser = results.find((r) => r.status === 409)!;
		expect(loser.json.error.message).toMatch(/Another decision was recorded first/);
		const winner = results.find((r) => r.status === 200)!;
		const state = await withClient(db.url, async (c) => ({
			lot: (await c.query('select status from lots where id = $1', [lot.id])).rows[0].status,
			overrides: (await c.query(`select count(*)::int as n from decisions where lot_id = $1 and kind = 'override'`, [lot.id])).rows[0].n,
			notices: (await c.query(`select count(*)::int as n from notices where lot_id = $1 and kind = 'override'`, [lot.id])).rows[0].n
		}));
		expect(state.lot).toBe(winner.json.status);
		expect(state.overrides).toBe(1);
		expect(state.notices).toBe(1);
	});

	it('marks a notice failed after its last attempt, shows it to the admin, and sends it once on "retry now"', async () => {
		await stopPeer();
		await app!.stop();
		app = await start({ OUTBOX_MAX_ATTEMPTS: '1' });
		const { buyer, inspector } = await callers(app.url);
		const lot = await measuredLot(buyer, inspector, 'accept');
		const id = (await call(inspector, `/api/v1/lots/${lot.id}/submit`, { method: 'POST' })).json.noticeId as string;
		await waitUntil(async () => (await noticeRows([id]))[0].status === 'failed', 20_000, 'the notice failed');
		expect((await noticeRows([id]))[0]).toMatchObject({ attempts: 1, message_id: null });
		const admin = await signInApi(app.url, 'admin@kestrel-mobility.example');
		const page = await fetch(`${app.url}/admin/outbox`, { headers: { cookie: admin } });
		expect(page.status).toBe(200);
		expect(await page.text()).toContain(`data-notice-id="${id}"`);
		await startPeer();
		const retry = () =>
			fetch(`${app!.url}/admin/outbox?/retry`, {
				method: 'POST',
				headers: { cookie: admin, origin: app!.url, accept: 'application/json', 'content-type': 'application/x-www-form-urlencoded' },
				body: new URLSearchParams({ noticeId: id })
			}).then((r) => r.json());
		expect(await retry()).toMatchObject({ type: 'success', status: 200 });
		await expectEachDeliveredOnce([id], peer!.httpUrl);
		expect(await retry()).toMatchObject({ type: 'failure', status: 409 }); // sent: nothing left to retry
	});
});
