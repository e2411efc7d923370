/**
 * Strict input in the pages (issue 18, item 6): the lot form's quantity typed as `1e7`, `1,5`,
 * `1e309` or `12abc` is refused with 400 naming the field (it used to be stored as 1 or 12), and
 * nothing is stored; the same for editing a lot and for a part's limits; NUL in a text field or a
 * list's search is a 400, never a 500; a NUL in the sign-in's return path is dropped.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startApp, type RunningApp } from '../helpers/app';
import { DEMO_PASSWORD, postForm, signInApi, tokenFor } from '../helpers/auth';
import { freshDatabase, withClient, type FreshDatabase } from '../helpers/db';
import { PART } from './decisions-fixtures';
import { createLot, lotFormFields, partByNumber, type Caller } from './readings-fixtures';

let app: RunningApp;
let db: FreshDatabase;
let buyer: Caller;
let buyerCookie: string;
let qualityCookie: string;

beforeAll(async () => {
	db = await freshDatabase('form_bad_input', { demo: false });
	app = await startApp({ databaseUrl: db.url });
	buyer = { base: app.url, token: await tokenFor(db.url, 'buyer@kestrel-mobility.example') };
	buyerCookie = await signInApi(app.url, 'buyer@kestrel-mobility.example');
	qualityCookie = await signInApi(app.url, 'quality@kestrel-mobility.example');
});

afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

const lotFields = (overrides: Record<string, string> = {}) => lotFormFields(buyer, PART, { po_number: 'KM-PO-STRICT', ...overrides });

const lotsWithPo = (po: string) =>
	withClient(db.url, async (c) => Number((await c.query('select count(*) as n from lots where po_number = $1', [po])).rows[0].n));

/** The refused page marks that field's input invalid and shows the message. */
function expectFieldRefused(html: string, field: string, message: RegExp) {
	const input = new RegExp(`<(?:input|select|textarea)[^>]*name="${field}"[^>]*>`).exec(html)?.[0];
	expect(input, `the ${field} input`).toBeDefined();
	expect(input).toMatch(/aria-invalid="true"/);
	expect(html).toMatch(message);
}

describe('the lot form', () => {
	it.each(['1e7', '1,5', '1e309', '12abc', '0x10', '2.5'])(
		'refuses quantity %j with 400 naming the quantity, storing nothing',
		async (quantity) => {
			const res = await postForm(app.url, '/lots/new', await lotFields({ quantity }), buyerCookie);
			const html = await res.text();
			expect(res.status, html.slice(0, 300)).toBe(400);
			expectFieldRefused(html, 'quantity', /Enter the number of units as a whole number/);
			expect(await lotsWithPo('KM-PO-STRICT')).toBe(0);
		}
	);

	it('refuses a NUL or another control character in the PO number, storing nothing', async () => {
		for (const po_number of ['KM-PO\u0000-1', 'KM-PO-\u001b[31m', 'KM\u202Eevil']) {
			const res = await postForm(app.url, '/lots/new', await lotFields({ po_number }), buyerCookie);
			const html = await res.text();
			expect(res.status, JSON.stringify(po_number)).toBe(400);
			expectFieldRefused(html, 'po_number', /control characters/);
		}
		const stored = await withClient(db.url, async (c) =>
			Number((await c.query(`select count(*) as n from lots where po_number like 'KM%'`)).rows[0].n)
		);
		expect(stored).toBe(0);
	});

	it('still registers a lot written plainly (the refusals above are about the input)', async () => {
		const res = await postForm(app.url, '/lots/new', await lotFields({ quantity: ' 1200 ', declared_soc_pct: '27.5' }), buyerCookie);
		expect(res.status).toBe(303);
		const row = await withClient(
			db.url,
			async (c) => (await c.query(`select quantity, declared_soc from lots where po_number = 'KM-PO-STRICT'`)).rows[0]
		);
		expect(row).toEqual({ quantity: 1200, declared_soc: 0.275 });
	});

	it('refuses the same quantities when editing a lot, changing nothing', async () => {
		const lot = await createLot(buyer, { partNumber: PART, quantity: 100, declaredSoc: 0.3 });
		for (const quantity of ['1e7', '1,5', '1e309']) {
			const res = await postForm(app.url, `/lots/${lot.id}/edit`, await lotFields({ po_number: 'KM-PO-EDITED', quantity }), buyerCookie);
			expect(res.status, quantity).toBe(400);
			expectFieldRefused(await res.text(), 'quantity', /Enter the number of units as a whole number/);
		}
		const row = await withClient(
			db.url,
			async (c) => (await c.query('select po_number, quantity from lots where id = $1', [lot.id])).rows[0]
		);
		expect(row.quantity).toBe(100);
		expect(row.po_number).not.toBe('KM-PO-EDITED');
	});
});

describe('other pages', () => {
	it('refuses a part limit typed as 1e1 or 2,5 (decimal fields too)', async () => {
		const part = await partByNumber(buyer, PART);
		const before = await withClient(db.url, async (c) => (await c.query('select outlier_k from parts where id = $1', [part.id])).rows[0]);
		for (const outlier_k of ['1e1', '2,5']) {
			const res = await postForm(app.url, `/parts/${part.id}?/limits`, { outlier_k }, qualityCookie);
			expect(res.status, outlier_k).toBe(400);
			expectFieldRefused(await res.text(), 'outlier_k', /Enter Outlier factor k as a number/);
		}
		const after = await withClient(db.url, async (c) => (await c.query('select outlier_k from parts where id = $1', [part.id])).rows[0]);
		expect(after).toEqual(before);
	});

	it.each(['/lots?search=%00', '/lots?search=PO%1B', '/lots?limit=1e1', '/parts?search=%00', '/lots?serial=%00'])(
		'answers %s with 400, not 500',
		async (path) => {
			const res = await fetch(`${app.url}${path}`, { headers: { cookie: buyerCookie, accept: 'text/html' }, redirect: 'manual' });
			const html = await res.text();
			expect(res.status, html.slice(0, 300)).toBe(400);
			expect(html).toMatch(/filters are not valid/);
		}
	);

	it('signs in with a NUL in the return path, going to the start page instead (no 500)', async () => {
		const res = await postForm(app.url, '/signin?/password', {
			email: 'buyer@kestrel-mobility.example',
			password: DEMO_PASSWORD,
			redirectTo: '/lots\u0000x'
		});
		expect(res.status).toBe(303);
		expect(new URL(res.headers.get('location')!, app.url).pathname).toBe('/');
	});

	it('refuses a NUL in a cancellation reason', async () => {
		const lot = await createLot(buyer, { partNumber: PART, quantity: 100, declaredSoc: 0.3 });
		const res = await postForm(app.url, `/lots/${lot.id}?/cancel`, { reason: 'duplicate\u0000order' }, buyerCookie);
		expect(res.status).toBe(400);
		const status = await withClient(
			db.url,
			async (c) => (await c.query('select status::text as s from lots where id = $1', [lot.id])).rows[0].s
		);
		expect(status).not.toBe('cancelled');
	});

	it('refuses a cancellation reason over 500 characters in a sentence instead of cutting it', async () => {
		const lot = await createLot(buyer, { partNumber: PART, quantity: 100, declaredSoc: 0.3 });
		const res = await postForm(app.url, `/lots/${lot.id}?/cancel`, { reason: 'r'.repeat(501) }, buyerCookie);
		expect(res.status).toBe(400);
		expect(await res.text()).toContain('limited to 500 characters and this one has 501');
		const status = await withClient(
			db.url,
			async (c) => (await c.query('select status::text as s from lots where id = $1', [lot.id])).rows[0].s
		);
		expect(status).not.toBe('cancelled');
	});
});
