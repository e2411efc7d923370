/**
 * Integrations through the built app on a fresh copy of the demo database: the served OpenAPI
 * document, signed webhooks from the graphile-worker queue (a receiver on 127.0.0.1, one that is
 * down first), the production refusal of internal webhook targets, and the serial trace across a
 * re-inspection. The first app runs with NODE_ENV=test, where loopback receivers are allowed.
 */
import { createHash, createHmac, randomBytes } from 'node:crypto';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { Validator } from '@seriousme/openapi-schema-validator';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { freePort } from '../../scripts/lib/proc.mjs';
import { buildOpenApiDocument } from '../../src/lib/server/openapi';
import { startApp, type RunningApp } from '../helpers/app';
import { tokenFor } from '../helpers/auth';
import { freshDatabase, withClient } from '../helpers/db';
import { call, createLot, modelReadings, type Caller } from './readings-fixtures';

interface Received {
	headers: Record<string, string | string[] | undefined>;
	body: string;
}

/** A webhook receiver on 127.0.0.1 that keeps what it got and answers 204. */
function receiver(port = 0): Promise<{ server: Server; url: string; got: Received[] }> {
	const got: Received[] = [];
	const server = createServer((req, res) => {
		let body = '';
		req.on('data', (chunk) => (body += chunk));
		req.on('end', () => {
			got.push({ headers: req.headers, body });
			res.statusCode = 204;
			res.end();
		});
	});
	return new Promise((resolve) =>
		server.listen(port, '127.0.0.1', () => resolve({ server, url: `http://127.0.0.1:${(server.address() as AddressInfo).port}/hook`, got }))
	);
}

/** Poll an observable state until it holds (no fixed sleeps); fails with what was last seen. */
async function until<T>(what: string, read: () => Promise<T> | T, ok: (value: T) => boolean, timeoutMs = 30_000): Promise<T> {
	const end = Date.now() + timeoutMs;
	let last: T = await read();
	while (!ok(last)) {
		if (Date.now() > end) throw new Error(`timed out waiting for ${what}; last seen ${JSON.stringify(last)}`);
		await new Promise((r) => setTimeout(r, 100));
		last = await read();
	}
	return last;
}

const signature = (body: string, secret: string) => `sha256=${createHmac('sha256', secret).update(body).digest('hex')}`;

let app: RunningApp;
let db: Awaited<ReturnType<typeof freshDatabase>>;
let admin: Caller, buyer: Caller, inspector: Caller, voltaria: Caller, ferrolith: Caller;
const servers: Server[] = [];

beforeAll(async () => {
	db = await freshDatabase('integrations', { demo: false }); // no lot history: normal inspection, n = 13
	app = await startApp({ databaseUrl: db.url, env: { NODE_ENV: 'test' } });
	const as = async (email: string) => ({ base: app.url, token: await tokenFor(db.url, email) });
	[admin, buyer, inspector, voltaria, ferrolith] = await Promise.all([
		as('admin@kestrel-mobility.example'),
		as('buyer@kestrel-mobility.example'),
		as('inspector@kestrel-mobility.example'),
		as('supplier@voltaria-cells.example'),
		as('supplier@ferrolith.example')
	]);
});

afterAll(async () => {
	for (const s of servers) s.close();
	await app?.stop();
	await db?.drop();
});

describe('GET /api/v1/openapi.json', () => {
	it('answers without sign-in with a valid OpenAPI 3.1 document of every route', async () => {
		const res = await fetch(`${app.url}/api/v1/openapi.json`);
		expect(res.status).toBe(200);
		const doc = await res.json();
		const result = await new Validator().validate(doc);
		expect(result.errors ?? []).toEqual([]);
		expect(doc.openapi).toBe('3.1.0');
		// The unit test holds the document to the route files; the served one is that document.
		expect(Object.keys(doc.paths).sort()).toEqual(Object.keys(buildOpenApiDocument().paths).sort());
	});
});

describe('webhooks', () => {
	it('posts lot.decided, signed with the secret, after a decision', async () => {
		const hook = await receiver();
		servers.push(hook.server);
		const created = await call(admin, '/api/v1/webhooks', { body: { url: hook.url, events: ['lot.decided'] } });
		expect(created.status).toBe(201);
		expect(created.json.secret).toMatch(/^whsec_/);
		const listed = await call(admin, '/api/v1/webhooks');
		expect(JSON.stringify(listed.json)).not.toContain(created.json.secret);

		// Lot of 100, AQL 1.0, level II: ISO 2859-1 Table 2-A gives code letter F, and F / 1.0 points to E: n = 13.
		const lot = await createLot(buyer, { partNumber: 'VC-21700-50G', quantity: 100, declaredSoc: 0.3 });
		expect((await call(inspector, `/api/v1/lots/${lot.id}/readings`, { body: { readings: modelReadings('NMC', 13, 0.3) } })).status).toBe(
			201
		);
		const submitted = await call(inspector, `/api/v1/lots/${lot.id}/submit`, { method: 'POST' });
		expect(submitted.status).toBe(201);

		const [got] = await until(
			'lot.decided at the receiver',
			() => hook.got,
			(g) => g.length > 0
		);
		expect(got.headers['x-restvolt-event']).toBe('lot.decided');
		expect(got.headers['x-restvolt-signature']).toBe(signature(got.body, created.json.secret));
		const body = JSON.parse(got.body);
		expect(body).toMatchObject({ event: 'lot.decided', data: { lot_id: lot.id, kind: 'automatic', to: submitted.json.status } });
		expect(Object.keys(body).sort()).toEqual(['data', 'event', 'id', 'occurred_at']);

		const log = await call(admin, `/api/v1/webhooks/${created.json.id}/deliveries`);
		await until(
			'the delivery logged as delivered',
			async () => (await call(admin, `/api/v1/webhooks/${created.json.id}/deliveries`)).json.deliveries[0],
			(d) => d?.status === 'delivered'
		);
		expect(log.status).toBe(200);
	});

	it('retries a delivery to a receiver that is down, and it arrives once the receiver is up', async () => {
		const port = await freePort();
		const url = `http://127.0.0.1:${port}/hook`;
		const created = await call(admin, '/api/v1/webhooks', { body: { url, events: ['lot.registered'] } });
		expect(created.status).toBe(201);
		const lot = await createLot(buyer, { partNumber: 'VC-21700-50G', quantity: 50, declaredSoc: 0.3 });
		const deliveries = async () => (await call(admin, `/api/v1/webhooks/${created.json.id}/deliveries`)).json.deliveries;
		const failed = await until('a failed first attempt', deliveries, (d) => d[0]?.attempts >= 1);
		expect(failed[0]).toMatchObject({ status: 'pending', response_status: null });
		expect(failed[0].last_error).toBeTruthy();

		const hook = await receiver(port);
		servers.push(hook.server);
		const [got] = await until(
			'the retried delivery',
			() => hook.got,
			(g) => g.length > 0,
			60_000
		);
		expect(JSON.parse(got.body)).toMatchObject({ event: 'lot.registered', data: { lot_id: lot.id } });
		expect(got.headers['x-restvolt-signature']).toBe(signature(got.body, created.json.secret));
		const done = await until('delivered in the log', deliveries, (d) => d[0]?.status === 'delivered');
		expect(done[0].response_status).toBe(204);
		expect(done[0].attempts).toBeGreaterThanOrEqual(2);
	});

	it('refuses a loopback or private target in production mode, naming the field', async () => {
		const production = await startApp({ databaseUrl: db.url });
		try {
			const prodAdmin = { base: production.url, token: admin.token };
			for (const target of [
				'http://127.0.0.1:9/hook',
				'http://10.1.2.3/hook',
				'http://[::1]/hook',
				'http://169.254.169.254/latest',
				'http://localhost/hook'
			]) {
				const res = await call(prodAdmin, '/api/v1/webhooks', { body: { url: target, events: ['lot.decided'] } });
				expect(res.status, target).toBe(422);
				expect(res.json.error.issues[0].path).toBe('url');
			}
		} finally {
			await production.stop();
		}
	});

	it('is for administrators only', async () => {
		expect((await call(buyer, '/api/v1/webhooks')).status).toBe(403);
		expect((await fetch(`${app.url}/api/v1/webhooks`)).status).toBe(401);
	});
});

describe('GET /api/v1/readings (serial trace)', () => {
	it('lists a serial found in two lots (re-inspection), and a supplier sees only its own', async () => {
		const serial = `TR-${Date.now()}`;
		const reading = (ocv: number) => ({ readings: [{ serial, ocv_v: ocv, temperature_c: 24 }] });
		const first = await createLot(buyer, { partNumber: 'VC-21700-50G', quantity: 100, declaredSoc: 0.3 });
		const second = await createLot(buyer, { partNumber: 'VC-21700-50G', quantity: 100, declaredSoc: 0.3 });
		expect((await call(inspector, `/api/v1/lots/${first.id}/readings`, { body: reading(3.6) })).status).toBe(201);
		expect((await call(inspector, `/api/v1/lots/${second.id}/readings`, { body: reading(3.61) })).status).toBe(201);

		const exact = await call(inspector, `/api/v1/readings?serial=${encodeURIComponent(serial)}`);
		expect(exact.status).toBe(200);
		expect(exact.json.readings.map((r: { lot_id: string }) => r.lot_id).sort()).toEqual([first.id, second.id].sort());
		expect(exact.json.readings[0]).toMatchObject({ serial, part_number: 'VC-21700-50G', decision: null });
		expect(exact.json.readings.map((r: { lot_code: string }) => r.lot_code).sort()).toEqual([first.lot_code, second.lot_code].sort());

		const prefix = await call(inspector, `/api/v1/readings?serial_prefix=${encodeURIComponent(serial.slice(0, -2))}`);
		expect(prefix.json.readings.filter((r: { serial: string }) => r.serial === serial)).toHaveLength(2);

		expect((await call(voltaria, `/api/v1/readings?serial=${encodeURIComponent(serial)}`)).json.readings).toHaveLength(2);
		const other = await call(ferrolith, `/api/v1/readings?serial=${encodeURIComponent(serial)}`);
		expect(other.status).toBe(200);
		expect(other.json.readings).toEqual([]);
	});

	it('names the parameter when the query is not understood', async () => {
		const neither = await call(inspector, '/api/v1/readings');
		expect(neither.status).toBe(400);
		expect(neither.json.error.issues[0].path).toBe('serial');
		const short = await call(inspector, '/api/v1/readings?serial_prefix=ab');
		expect(short.json.error.issues[0].path).toBe('serial_prefix');
	});
});

describe('API token scopes', () => {
	/** A token of the inspector with a scope and an expiry, stored as the admin page stores it (sha256 only). */
	async function scopedToken(scope: string, expiresAt: string): Promise<Caller> {
		const token = `rv_${randomBytes(32).toString('base64url')}`;
		await withClient(db.url, (c) =>
			c.query(
				`insert into api_tokens (user_id, label, token_hash, prefix, scope, expires_at)
				 select id, 'scope test', $1, $2, $3, $4 from "user" where email = 'inspector@kestrel-mobility.example'`,
				[createHash('sha256').update(token).digest('hex'), token.slice(0, 10), scope, expiresAt]
			)
		);
		return { base: app.url, token };
	}

	it('a read-only token reads but may not record readings (403 token_scope); an expired token is not accepted', async () => {
		const lot = await createLot(buyer, { partNumber: 'VC-21700-50G', quantity: 100, declaredSoc: 0.3 });
		const tomorrow = new Date(Date.now() + 86_400_000).toISOString();
		const reader = await scopedToken('read', tomorrow);
		expect((await call(reader, `/api/v1/lots/${lot.id}`)).status).toBe(200);
		const refused = await call(reader, `/api/v1/lots/${lot.id}/readings`, { body: { readings: modelReadings('NMC', 1, 0.3) } });
		expect(refused.status).toBe(403);
		expect(refused.json.error.code).toBe('token_scope');
		const writer = await scopedToken('readings:write', tomorrow);
		expect((await call(writer, `/api/v1/lots/${lot.id}/readings`, { body: { readings: modelReadings('NMC', 1, 0.3) } })).status).toBe(201);
		expect((await call(writer, `/api/v1/lots/${lot.id}/submit`, { method: 'POST' })).status).toBe(403);
		const expired = await scopedToken('role', new Date(Date.now() - 1000).toISOString());
		expect((await call(expired, '/api/v1/me')).status).toBe(401);
	});
});
