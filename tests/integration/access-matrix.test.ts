/**
 * The role × route matrix of issue 5 ("Done when"): every API route and the main pages, called as
 * buyer, inspector, quality, supplier A (Voltaria), supplier B (Ferrolith), admin and anonymous.
 * Expected answers are written out by hand from src/lib/server/policy.ts GRANTS and the issue's
 * role list (not computed with can(), which would test the policy against itself):
 *   ok  → 2xx (pages: 200)          403 → the role may not do this
 *   404 → another supplier's lot, report, notice, readings.xlsx, quarantine tag or document by id
 *   401 → anonymous API call        pages: anonymous → 303 /signin, supplier on staff pages → 303
 *                                    /portal, staff on the portal → 303 /
 * Every lot-scoped resource below belongs to supplier A, so supplier B must get 404.
 */
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startApp, type RunningApp } from '../helpers/app';
import { CookieJar, DEMO_PASSWORD, postForm, signInApi, signInLinkFor, tokenFor } from '../helpers/auth';
import { freshDatabase, withClient } from '../helpers/db';
import { apiRouteFiles, seedIds, type SeedIds } from './hardening-fixtures';
import { measuredLot } from './decisions-fixtures';
import { partByNumber } from './readings-fixtures';

const ROLES = ['buyer', 'inspector', 'quality', 'supplierA', 'supplierB', 'admin', 'anonymous'] as const;
type RoleKey = (typeof ROLES)[number];
type Expect = 'ok' | 401 | 403 | 404;
const ok = 'ok' as const;

const EMAIL: Record<Exclude<RoleKey, 'anonymous'>, string> = {
	buyer: 'buyer@kestrel-mobility.example',
	inspector: 'inspector@kestrel-mobility.example',
	quality: 'quality@kestrel-mobility.example',
	supplierA: 'supplier@voltaria-cells.example',
	supplierB: 'supplier@ferrolith.example',
	admin: 'admin@kestrel-mobility.example'
};

let app: RunningApp;
let db: Awaited<ReturnType<typeof freshDatabase>>;
let ids: SeedIds;
/** A's lots used by the matrix: read (on hold, with readings, documents, a notice), write targets. */
let L: {
	read: string;
	open: string;
	decide: string;
	submitByInspector: string;
	submitByQuality: string;
	readingId: number;
	notice: string;
	document: string;
};
let tokens: Record<Exclude<RoleKey, 'anonymous'>, string>;
let cookies: Record<Exclude<RoleKey, 'anonymous'>, string>;
let fitPoints: Array<{ soc: number; ocv_v: number }>;
let partIdA: string;
let savedModelId = '';
/** A webhook endpoint registered by the admin, one of its deliveries, and a serial of A's read lot. */
let hook: { id: string; delivery: string };
let tracedSerial = '';

interface ApiCase {
	name: string; // 'METHOD route-file-path' as on disk (checked against the file tree)
	path: () => string;
	method?: 'GET' | 'POST' | 'PATCH' | 'DELETE';
	/** Body for the call; a fresh one per role (distinct serials, file bytes…). */
	body?: (role: RoleKey) => unknown | Promise<unknown>;
	form?: (role: RoleKey) => FormData;
	/** Use the session cookie instead of the token (quality decisions are e-signed in a session). */
	session?: boolean;
	expect: Record<RoleKey, Expect>;
}

/** One row: buyer, inspector, quality, supplier A, supplier B, admin, anonymous. */
const row = (...e: Expect[]): Record<RoleKey, Expect> => Object.fromEntries(ROLES.map((r, i) => [r, e[i]])) as Record<RoleKey, Expect>;

const pdf = (text: string) => new Blob([new TextEncoder().encode(`%PDF-1.4\n% ${text}\n%%EOF\n`)], { type: 'application/pdf' });

function apiCases(): ApiCase[] {
	const lot =
		(suffix = '') =>
		() =>
			`/api/v1/lots/${L.read}${suffix}`;
	return [
		//                                                                                       buyer inspector quality supA supB admin anon
		{ name: 'GET health', path: () => '/api/v1/health', expect: row(ok, ok, ok, ok, ok, ok, ok) },
		{ name: 'GET me', path: () => '/api/v1/me', expect: row(ok, ok, ok, ok, ok, ok, 401) },
		{ name: 'GET chemistries', path: () => '/api/v1/chemistries', expect: row(ok, ok, ok, 403, 403, ok, 401) },
		{
			name: 'GET chemistries/[code]/curve',
			path: () => '/api/v1/chemistries/NMC/curve?points=11',
			expect: row(ok, ok, ok, 403, 403, ok, 401)
		},
		{
			name: 'POST electrochem/cell-potential',
			path: () => '/api/v1/electrochem/cell-potential',
			body: () => ({ e0_v: 1.1, n: 2, temperature_c: 25, q: 1 }),
			expect: row(ok, ok, ok, 403, 403, ok, 401)
		},
		{
			name: 'POST ocv/evaluate',
			path: () => '/api/v1/ocv/evaluate',
			body: () => ({ chemistry: 'NMC', readings: [{ ocv_v: 3.6, temperature_c: 25 }] }),
			expect: row(ok, ok, ok, 403, 403, ok, 401)
		},
		{
			name: 'POST ocv/fit',
			path: () => '/api/v1/ocv/fit',
			body: () => ({ chemistry: 'NMC', temperature_c: 25, points: fitPoints }),
			expect: row(ok, ok, ok, 403, 403, ok, 401)
		},
		{ name: 'GET models', path: () => '/api/v1/models', expect: row(ok, ok, ok, 403, 403, 403, 401) },
		{ name: 'GET models/[id=uuid]', path: () => `/api/v1/models/${ids.libraryModel}`, expect: row(ok, ok, ok, 403, 403, 403, 401) },
		{
			name: 'POST models',
			path: () => '/api/v1/models',
			body: (r) => ({ chemistry: 'NMC', temperature_c: 25, points: fitPoints, label: `matrix ${r}` }),
			expect: row(403, 403, ok, 403, 403, 403, 401)
		},
		{
			// Fitted by the second quality manager (beforeAll): four eyes, so the first may approve it.
			name: 'POST models/[id=uuid]/approve',
			path: () => `/api/v1/models/${savedModelId}/approve`,
			body: () => ({ password: DEMO_PASSWORD, reason: 'matrix: residuals checked' }),
			expect: row(403, 403, ok, 403, 403, 403, 401)
		},
		{ name: 'GET lots', path: () => '/api/v1/lots', expect: row(ok, ok, ok, ok, ok, 403, 401) },
		{
			name: 'POST lots',
			path: () => '/api/v1/lots',
			body: (r) => ({
				po_number: `PO-MATRIX-${r}`,
				supplier_id: ids.supplier.a,
				part_id: partIdA,
				quantity: 100,
				declared_soc: 0.3,
				transport: 'road',
				un_number: 'UN3480'
			}),
			expect: row(ok, 403, 403, 403, 403, 403, 401)
		},
		{ name: 'GET lots.xlsx', path: () => '/api/v1/lots.xlsx', expect: row(ok, ok, ok, ok, ok, 403, 401) },
		{ name: 'GET lots/[id=uuid]', path: lot(), expect: row(ok, ok, ok, ok, 404, 403, 401) },
		{ name: 'GET lots/[id=uuid]/decisions', path: lot('/decisions'), expect: row(ok, ok, ok, ok, 404, 403, 401) },
		{ name: 'GET lots/[id=uuid]/evaluation', path: lot('/evaluation?detail=summary'), expect: row(ok, ok, ok, ok, 404, 403, 401) },
		{ name: 'GET lots/[id=uuid]/readings', path: lot('/readings'), expect: row(ok, ok, ok, ok, 404, 403, 401) },
		{ name: 'GET lots/[id=uuid]/readings.xlsx', path: lot('/readings.xlsx'), expect: row(ok, ok, ok, ok, 404, 403, 401) },
		{ name: 'GET lots/[id=uuid]/report.pdf', path: lot('/report.pdf'), expect: row(ok, ok, ok, ok, 404, 403, 401) },
		{ name: 'GET lots/[id=uuid]/quarantine-tag.pdf', path: lot('/quarantine-tag.pdf'), expect: row(ok, ok, ok, ok, 404, 403, 401) },
		{ name: 'GET lots/[id=uuid]/documents', path: lot('/documents'), expect: row(ok, ok, ok, ok, 404, 403, 401) },
		{
			name: 'GET lots/[id=uuid]/documents/[docId=uuid]',
			path: () => `/api/v1/lots/${L.read}/documents/${L.document}`,
			expect: row(ok, ok, ok, ok, 404, 403, 401)
		},
		{
			name: 'POST lots/[id=uuid]/documents',
			path: lot('/documents'),
			form: (r) => {
				const f = new FormData();
				f.set('kind', 'other');
				f.set('file', pdf(`matrix ${r}`), `matrix-${r}.pdf`);
				return f;
			},
			expect: row(ok, 403, 403, 403, 403, 403, 401)
		},
		{
			name: 'POST lots/[id=uuid]/readings',
			path: () => `/api/v1/lots/${L.open}/readings`,
			body: (r) => ({ readings: [{ serial: `MX-${r}`, ocv_v: 3.6, temperature_c: 25 }] }),
			expect: row(403, ok, 403, 403, 403, 403, 401)
		},
		{
			name: 'PATCH lots/[id=uuid]/readings/[readingId]',
			method: 'PATCH',
			path: () => `/api/v1/lots/${L.open}/readings/${L.readingId}`,
			body: () => ({ temperature_c: 24.5, reason: 'matrix: thermometer misread' }),
			expect: row(403, ok, 403, 403, 403, 403, 401)
		},
		{
			name: 'POST lots/[id=uuid]/imports',
			path: () => `/api/v1/lots/${L.open}/imports`,
			form: (r) => {
				const f = new FormData();
				f.set('file', new Blob([`serial,ocv,temp\nIMP-${r}-1,3.61,25\nIMP-${r}-2,3.62,25\n`], { type: 'text/csv' }), `meter-${r}.csv`);
				f.set('mapping', JSON.stringify({ serial: 0, ocv: 1, temperature: 2 }));
				return f;
			},
			expect: row(403, ok, 403, 403, 403, 403, 401)
		},
		{
			name: 'POST lots/[id=uuid]/submit',
			path: () => `/api/v1/lots/${L.submitByInspector}/submit`,
			expect: row(403, ok, ok, 403, 403, 403, 401)
		},
		{
			name: 'POST lots/[id=uuid]/decision/challenge',
			path: () => `/api/v1/lots/${L.decide}/decision/challenge`,
			session: true,
			body: () => ({ decision: 'reject' }),
			expect: row(403, 403, ok, 403, 403, 403, 401)
		},
		{
			name: 'POST lots/[id=uuid]/decision',
			path: () => `/api/v1/lots/${L.decide}/decision`,
			session: true,
			// Quality signs with a challenge of its own; the others are refused before the body is read.
			body: async (r) => ({
				decision: 'reject',
				disposition: 'return_to_supplier',
				due_date: new Date(Date.now() + 14 * 86_400_000).toISOString().slice(0, 10),
				reason: 'matrix: confirmed the hold',
				password: DEMO_PASSWORD,
				challenge_id: r === 'quality' ? await signingChallenge(L.decide, 'reject') : randomUUID()
			}),
			expect: row(403, 403, ok, 403, 403, 403, 401)
		},
		{ name: 'GET notices', path: () => '/api/v1/notices', expect: row(ok, ok, ok, ok, ok, 403, 401) },
		{ name: 'GET notices?lot_id', path: () => `/api/v1/notices?lot_id=${L.read}`, expect: row(ok, ok, ok, ok, 404, 403, 401) },
		{
			name: 'POST notices/[id=uuid]/acknowledge',
			path: () => `/api/v1/notices/${L.notice}/acknowledge`,
			expect: row(403, 403, 403, ok, 404, 403, 401)
		},
		{ name: 'GET parts', path: () => '/api/v1/parts', expect: row(ok, ok, ok, 403, 403, 403, 401) },
		{ name: 'GET sampling/plan', path: () => '/api/v1/sampling/plan?lot_size=500&aql=0.65', expect: row(ok, ok, ok, 403, 403, 403, 401) },
		{ name: 'GET suppliers', path: () => '/api/v1/suppliers', expect: row(ok, ok, ok, 403, 403, 403, 401) },
		{
			name: 'GET suppliers/[id=uuid]/scorecard',
			path: () => `/api/v1/suppliers/${ids.supplier.a}/scorecard`,
			expect: row(ok, ok, ok, 403, 403, 403, 401)
		},
		{
			name: 'GET suppliers/[id=uuid]/scorecard.xlsx',
			path: () => `/api/v1/suppliers/${ids.supplier.a}/scorecard.xlsx?period=12m`,
			expect: row(ok, ok, ok, 403, 403, 403, 401)
		},
		{
			name: 'GET suppliers/[id=uuid]/scorecard.pdf',
			path: () => `/api/v1/suppliers/${ids.supplier.a}/scorecard.pdf?period=90d`,
			expect: row(ok, ok, ok, 403, 403, 403, 401)
		},
		{ name: 'GET openapi.json', path: () => '/api/v1/openapi.json', expect: row(ok, ok, ok, ok, ok, ok, ok) },
		// Supplier B may trace serials too, and finds only its own (checked below).
		{
			name: 'GET readings',
			path: () => `/api/v1/readings?serial=${encodeURIComponent(tracedSerial)}`,
			expect: row(ok, ok, ok, ok, ok, 403, 401)
		},
		{ name: 'GET webhooks', path: () => '/api/v1/webhooks', expect: row(403, 403, 403, 403, 403, ok, 401) },
		{
			name: 'POST webhooks',
			path: () => '/api/v1/webhooks',
			body: (r) => ({ url: `http://127.0.0.1:9/matrix-${r}`, events: ['lot.decided'] }),
			expect: row(403, 403, 403, 403, 403, ok, 401)
		},
		{ name: 'GET webhooks/[id=uuid]', path: () => `/api/v1/webhooks/${hook.id}`, expect: row(403, 403, 403, 403, 403, ok, 401) },
		{
			name: 'PATCH webhooks/[id=uuid]',
			method: 'PATCH',
			path: () => `/api/v1/webhooks/${hook.id}`,
			body: () => ({ paused: true }),
			expect: row(403, 403, 403, 403, 403, ok, 401)
		},
		{
			name: 'GET webhooks/[id=uuid]/deliveries',
			path: () => `/api/v1/webhooks/${hook.id}/deliveries`,
			expect: row(403, 403, 403, 403, 403, ok, 401)
		},
		{
			name: 'POST webhooks/[id=uuid]/deliveries/[deliveryId=uuid]/resend',
			path: () => `/api/v1/webhooks/${hook.id}/deliveries/${hook.delivery}/resend`,
			expect: row(403, 403, 403, 403, 403, ok, 401)
		},
		{
			name: 'POST webhooks/[id=uuid]/rotate-secret',
			path: () => `/api/v1/webhooks/${hook.id}/rotate-secret`,
			expect: row(403, 403, 403, 403, 403, ok, 401)
		},
		// Last of the webhook rows: the admin's call deletes the endpoint.
		{
			name: 'DELETE webhooks/[id=uuid]',
			method: 'DELETE',
			path: () => `/api/v1/webhooks/${hook.id}`,
			expect: row(403, 403, 403, 403, 403, ok, 401)
		}
	];
}

/** Roles that get a 2xx go last, so a successful write (submit, decision, approve) cannot change what the others see. */
const ORDER: RoleKey[] = ['anonymous', 'admin', 'supplierB', 'buyer', 'supplierA', 'inspector', 'quality'];

async function callApi(c: ApiCase, role: RoleKey) {
	const headers: Record<string, string> = {};
	if (role !== 'anonymous') {
		if (c.session) {
			headers.cookie = cookies[role];
			headers.origin = app.url;
		} else headers.authorization = `Bearer ${tokens[role]}`;
	}
	let body: BodyInit | undefined;
	// Anonymous uploads come from the same site (a browser without a session): else the cross-site check answers 403 first.
	if (c.form && role === 'anonymous') headers.origin = app.url;
	if (c.form) body = c.form(role);
	else if (c.body) {
		body = JSON.stringify(await c.body(role));
		headers['content-type'] = 'application/json';
	}
	// Quality's submit goes to its own ready lot (the inspector's lot is submitted by then).
	const path = c.name === 'POST lots/[id=uuid]/submit' && role === 'quality' ? `/api/v1/lots/${L.submitByQuality}/submit` : c.path();
	const res = await fetch(`${app.url}${path}`, {
		method: c.method ?? (body ? 'POST' : c.name.startsWith('POST') ? 'POST' : 'GET'),
		headers,
		body,
		redirect: 'manual'
	});
	const text = await res.text();
	return { status: res.status, text, type: res.headers.get('content-type') ?? '' };
}

beforeAll(async () => {
	db = await freshDatabase('access_matrix');
	// NODE_ENV=test lets the admin register a loopback webhook receiver (refused in production: integrations.test.ts).
	app = await startApp({ databaseUrl: db.url, env: { NODE_ENV: 'test' } });
	ids = await seedIds(db.url);
	tokens = Object.fromEntries(
		await Promise.all(Object.entries(EMAIL).map(async ([r, e]) => [r, await tokenFor(db.url, e)]))
	) as typeof tokens;
	const staff = ['buyer', 'inspector', 'quality', 'admin'] as const;
	cookies = {} as typeof cookies;
	for (const r of staff) cookies[r] = await signInApi(app.url, EMAIL[r]);
	for (const r of ['supplierA', 'supplierB'] as const) cookies[r] = await supplierSession(EMAIL[r]);

	const buyer = { base: app.url, token: tokens.buyer };
	const inspector = { base: app.url, token: tokens.inspector };
	partIdA = (await partByNumber(buyer, 'VC-21700-50G')).id;
	const curve = await (
		await fetch(`${app.url}/api/v1/chemistries/NMC/curve?points=41`, { headers: { authorization: `Bearer ${tokens.buyer}` } })
	).json();
	fitPoints = curve.points.filter((p: { soc: number }) => p.soc >= 0.05 && p.soc <= 0.95);
	// A model version fitted by the second quality manager, for the first to approve.
	const quality2 = await tokenFor(db.url, 'quality2@kestrel-mobility.example');
	const saved = await fetch(`${app.url}/api/v1/models`, {
		method: 'POST',
		headers: { authorization: `Bearer ${quality2}`, 'content-type': 'application/json' },
		body: JSON.stringify({ chemistry: 'NMC', temperature_c: 25, points: fitPoints, label: 'matrix' })
	});
	if (saved.status !== 201) throw new Error(`model not saved: ${saved.status} ${await saved.text()}`);
	savedModelId = (await saved.json()).id;
	// A webhook endpoint with one delivery: registered before a lot is, so lot.registered is queued for it.
	const admin = { authorization: `Bearer ${tokens.admin}`, 'content-type': 'application/json' };
	const registered = await fetch(`${app.url}/api/v1/webhooks`, {
		method: 'POST',
		headers: admin,
		body: JSON.stringify({ url: 'http://127.0.0.1:9/matrix', events: ['lot.registered'] })
	});
	if (registered.status !== 201) throw new Error(`webhook not registered: ${registered.status} ${await registered.text()}`);
	const hookId: string = (await registered.json()).id;
	const ready1 = await measuredLot(buyer, inspector, 'accept');
	const ready2 = await measuredLot(buyer, inspector, 'accept');
	L = await withClient(db.url, async (c) => {
		const q = async (sql: string, p: unknown[]) => (await c.query(sql, p)).rows[0];
		// An on-hold lot of A with readings, a document and a notice: the read target.
		const read = await q(
			`select l.id from lots l where l.supplier_id = $1 and l.status = 'on_hold'
			 and exists (select 1 from notices n where n.lot_id = l.id) and exists (select 1 from documents d where d.lot_id = l.id)
			 and exists (select 1 from readings r where r.lot_id = l.id) order by l.created_at limit 1`,
			[ids.supplier.a]
		);
		const decide = await q(`select id from lots where supplier_id = $1 and status = 'on_hold' and id <> $2 order by created_at limit 1`, [
			ids.supplier.a,
			read.id
		]);
		const open = await q(`select id from lots where supplier_id = $1 and status = 'in_inspection' order by created_at limit 1`, [
			ids.supplier.a
		]);
		return {
			read: read.id,
			decide: decide.id,
			open: open.id,
			submitByInspector: ready1.id,
			submitByQuality: ready2.id,
			readingId: Number((await q('select min(id) as id from readings where lot_id = $1', [open.id])).id),
			// A notice sent to supplier A (quality's review alerts about its lots are internal, not A's).
			notice: (await q('select id from notices where organisation_id = $1 order by created_at limit 1', [ids.supplier.a])).id,
			document: (await q('select id from documents where lot_id = $1 order by id limit 1', [read.id])).id
		};
	});
	await withClient(db.url, async (c) => {
		const delivery = (await c.query('select id from webhook_deliveries where endpoint_id = $1 limit 1', [hookId])).rows[0];
		if (!delivery) throw new Error('no webhook delivery was queued for the lot registrations');
		hook = { id: hookId, delivery: delivery.id };
		tracedSerial = (await c.query('select serial from readings where lot_id = $1 order by id limit 1', [L.read])).rows[0].serial;
	});
}, 120_000);

afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

/** A signing challenge for quality's session (POST …/decision/challenge). */
async function signingChallenge(lotId: string, decision: 'accept' | 'reject'): Promise<string> {
	const res = await fetch(`${app.url}/api/v1/lots/${lotId}/decision/challenge`, {
		method: 'POST',
		headers: { cookie: cookies.quality, origin: app.url, 'content-type': 'application/json' },
		body: JSON.stringify({ decision })
	});
	if (res.status !== 201) throw new Error(`no signing challenge for ${lotId}: ${res.status} ${await res.text()}`);
	return (await res.json()).challenge_id;
}

/** A supplier signs in by the e-mailed link (read from the SMTP peer) and keeps the session cookie. */
async function supplierSession(email: string): Promise<string> {
	const since = Date.now() - 1000;
	const ask = await postForm(app.url, '/signin?/link', { email, redirectTo: '' });
	if (ask.status !== 303) throw new Error(`link request refused for ${email}: ${ask.status}`);
	const jar = new CookieJar();
	jar.take(await fetch(await signInLinkFor(email, since), { redirect: 'manual' }));
	if (!jar.header().includes('session-token')) throw new Error(`no session for ${email}`);
	return jar.header();
}

describe('role × API route matrix', () => {
	it('has a row for every API route file and method under src/routes/api/v1', () => {
		const onDisk = apiRouteFiles().flatMap((f) => f.methods.map((m) => `${m} ${f.route}`));
		const covered = new Set(apiCases().map((c) => c.name.split('?')[0]));
		expect(onDisk.filter((r) => !covered.has(r))).toEqual([]);
	});

	it('answers each role as the policy says (ok / 401 / 403 / 404)', async () => {
		const wrong: string[] = [];
		for (const c of apiCases()) {
			for (const role of ORDER) {
				const want = c.expect[role];
				const got = await callApi(c, role);
				const fine = want === ok ? got.status >= 200 && got.status < 300 : got.status === want;
				if (!fine) wrong.push(`${c.name} as ${role}: expected ${want}, got ${got.status} ${got.text.slice(0, 160)}`);
				if (want !== ok && got.status >= 400) {
					// Refusals are in the API's error shape.
					if (!/^application\/json/.test(got.type) || !JSON.parse(got.text)?.error?.code)
						wrong.push(`${c.name} as ${role}: refusal not in the error shape: ${got.text.slice(0, 160)}`);
				}
			}
		}
		expect(wrong).toEqual([]);
	}, 120_000);

	it('lists only the supplier’s own lots and notices to a supplier', async () => {
		for (const [role, own] of [
			['supplierA', ids.supplier.a],
			['supplierB', ids.supplier.b]
		] as const) {
			const auth = { authorization: `Bearer ${tokens[role]}` };
			const lots = (await (await fetch(`${app.url}/api/v1/lots?limit=100`, { headers: auth })).json()).lots as Array<{
				supplier_id: string;
			}>;
			expect(lots.length).toBeGreaterThan(0);
			expect(lots.every((l) => l.supplier_id === own)).toBe(true);
			const notices = (await (await fetch(`${app.url}/api/v1/notices`, { headers: auth })).json()).notices as Array<{
				lot_id?: string;
				lotId?: string;
			}>;
			expect(notices.length).toBeGreaterThan(0);
			const lotIds = await withClient(db.url, async (c) =>
				(await c.query('select id from lots where supplier_id = $1', [own])).rows.map((r) => r.id)
			);
			expect(notices.every((n) => lotIds.includes(n.lot_id ?? n.lotId))).toBe(true);
			// The serial trace of a unit in A's lot: A finds it, B finds nothing.
			const trace = (await (await fetch(`${app.url}/api/v1/readings?serial=${encodeURIComponent(tracedSerial)}`, { headers: auth })).json())
				.readings as Array<{ lot_id: string }>;
			if (role === 'supplierA') expect(trace.length).toBeGreaterThan(0);
			else expect(trace).toEqual([]);
			expect(trace.every((t) => lotIds.includes(t.lot_id))).toBe(true);
		}
	});

	it('refuses a quality decision sent with an API token (a decision is e-signed in a session)', async () => {
		const res = await fetch(`${app.url}/api/v1/lots/${L.read}/decision`, {
			method: 'POST',
			headers: { authorization: `Bearer ${tokens.quality}`, 'content-type': 'application/json' },
			body: JSON.stringify({ decision: 'reject', reason: 'token attempt', password: DEMO_PASSWORD })
		});
		expect(res.status).toBe(403);
		expect((await res.json()).error.code).toBe('session_required');
	});
});

// ---------------------------------------------------------------- pages

type PageExpect = 200 | 403 | 404 | '→signin' | '→portal' | '→home';
const prow = (...e: PageExpect[]): Record<RoleKey, PageExpect> =>
	Object.fromEntries(ROLES.map((r, i) => [r, e[i]])) as Record<RoleKey, PageExpect>;
const S = '→signin' as const;
const P = '→portal' as const;
const H = '→home' as const;

function pageCases(): Array<{ path: string; expect: Record<RoleKey, PageExpect> }> {
	return [
		//                                                        buyer inspector quality supA supB admin anon
		{ path: '/lots', expect: prow(200, 200, 200, P, P, 403, S) },
		{ path: '/lots/new', expect: prow(200, 403, 403, P, P, 403, S) },
		{ path: `/lots/${L.read}`, expect: prow(200, 200, 200, P, P, 403, S) },
		{ path: `/lots/${L.open}/inspect`, expect: prow(200, 200, 200, P, P, 403, S) },
		{ path: '/inspect', expect: prow(200, 200, 200, P, P, 403, S) },
		{ path: '/parts', expect: prow(200, 200, 200, P, P, 403, S) },
		{ path: '/parts/new', expect: prow(200, 403, 403, P, P, 403, S) },
		{ path: `/parts/${partIdA}`, expect: prow(200, 200, 200, P, P, 403, S) },
		{ path: '/suppliers', expect: prow(200, 200, 200, P, P, 403, S) },
		{ path: `/suppliers/${ids.supplier.a}`, expect: prow(200, 200, 200, P, P, 403, S) },
		{ path: `/suppliers/${ids.supplier.a}/scorecard`, expect: prow(200, 200, 200, P, P, 403, S) },
		{ path: '/suppliers/compare?chemistry=NMC&period=12m', expect: prow(200, 200, 200, P, P, 403, S) },
		{ path: '/models', expect: prow(200, 200, 200, P, P, 200, S) },
		{ path: '/models/NMC', expect: prow(200, 200, 200, P, P, 200, S) },
		{ path: '/review', expect: prow(403, 403, 200, P, P, 403, S) },
		{ path: `/review/${L.read}`, expect: prow(403, 403, 200, P, P, 403, S) },
		{ path: '/admin/users', expect: prow(403, 403, 403, P, P, 200, S) },
		{ path: '/admin/organisations', expect: prow(403, 403, 403, P, P, 200, S) },
		{ path: `/admin/organisations/${ids.supplier.a}`, expect: prow(403, 403, 403, P, P, 200, S) },
		{ path: '/admin/tokens', expect: prow(403, 403, 403, P, P, 200, S) },
		{ path: '/admin/outbox', expect: prow(403, 403, 403, P, P, 200, S) },
		{ path: '/portal', expect: prow(H, H, H, 200, 200, H, S) },
		{ path: `/portal/lots/${L.read}`, expect: prow(H, H, H, 200, 404, H, S) }
	];
}

describe('role × page matrix', () => {
	it('serves, refuses or redirects each main page as the policy says', async () => {
		const wrong: string[] = [];
		for (const page of pageCases()) {
			for (const role of ROLES) {
				const headers: Record<string, string> = role === 'anonymous' ? {} : { cookie: cookies[role] };
				const res = await fetch(`${app.url}${page.path}`, { headers, redirect: 'manual' });
				await res.arrayBuffer();
				const location = res.headers.get('location') ?? '';
				const want = page.expect[role];
				const got =
					res.status === 303 && location.startsWith('/signin')
						? S
						: res.status === 303 && location === '/portal'
							? P
							: res.status === 303 && location === '/'
								? H
								: res.status;
				if (got !== want) wrong.push(`${page.path} as ${role}: expected ${want}, got ${res.status} ${location}`);
			}
		}
		expect(wrong).toEqual([]);
	}, 120_000);
});
