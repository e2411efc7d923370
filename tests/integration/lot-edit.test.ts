/**
 * Editing a lot's purchase facts (/lots/{id}/edit): a buyer may, until the lot reaches the bench;
 * the change is stored and audited; bad input is refused with nothing changed; other roles and
 * lots already on the bench are refused.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startApp, type RunningApp } from '../helpers/app';
import { postForm, signInApi, tokenFor } from '../helpers/auth';
import { freshDatabase, withClient } from '../helpers/db';
import { PART } from './decisions-fixtures';
import { call, createLot, lotFormFields, modelReadings, type Caller } from './readings-fixtures';

let app: RunningApp;
let db: Awaited<ReturnType<typeof freshDatabase>>;
let buyer: Caller, inspector: Caller;
let buyerCookie: string, inspectorCookie: string;

beforeAll(async () => {
	db = await freshDatabase('lot_edit', { demo: false });
	app = await startApp({ databaseUrl: db.url });
	buyer = { base: app.url, token: await tokenFor(db.url, 'buyer@kestrel-mobility.example') };
	inspector = { base: app.url, token: await tokenFor(db.url, 'inspector@kestrel-mobility.example') };
	buyerCookie = await signInApi(app.url, 'buyer@kestrel-mobility.example');
	inspectorCookie = await signInApi(app.url, 'inspector@kestrel-mobility.example');
});

afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

const stored = (id: string) =>
	withClient(
		db.url,
		async (c) =>
			(await c.query('select po_number, quantity, declared_soc, transport, expected_arrival::text from lots where id = $1', [id])).rows[0]
	);

const editFields = (overrides: Record<string, string> = {}) => lotFormFields(buyer, PART, { po_number: 'KM-PO-EDIT-1', ...overrides });

const page = (id: string, cookie: string) => fetch(`${app.url}/lots/${id}/edit`, { headers: { cookie }, redirect: 'manual' });

describe('editing a lot before it reaches the bench', () => {
	it('stores the buyer’s changes, audits them and returns to the lot page', async () => {
		const lot = await createLot(buyer, { partNumber: PART, quantity: 100, declaredSoc: 0.3 });
		expect((await page(lot.id, buyerCookie)).status).toBe(200);
		const res = await postForm(app.url, `/lots/${lot.id}/edit`, await editFields(), buyerCookie);
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toBe(`/lots/${lot.id}?edited=1`);
		expect(await stored(lot.id)).toEqual({
			po_number: 'KM-PO-EDIT-1',
			quantity: 250,
			declared_soc: 0.25,
			transport: 'sea',
			expected_arrival: '2026-12-20'
		});
		const audit = await withClient(
			db.url,
			async (c) => (await c.query("select actor_email from audit_events where action = 'lot.update' and lot_id = $1", [lot.id])).rows
		);
		expect(audit).toEqual([{ actor_email: 'buyer@kestrel-mobility.example' }]);
	});

	it('refuses bad input with 400 and changes nothing', async () => {
		const lot = await createLot(buyer, { partNumber: PART, quantity: 100, declaredSoc: 0.3 });
		const before = await stored(lot.id);
		const refused: Array<Record<string, string>> = [
			{ quantity: '0' },
			{ declared_soc_pct: '140' },
			{ transport: 'teleport' },
			{ un_number: 'UN34' },
			{ part_id: 'not-a-uuid' }
		];
		for (const bad of refused) {
			const res = await postForm(app.url, `/lots/${lot.id}/edit`, await editFields(bad), buyerCookie);
			expect(res.status, JSON.stringify(bad)).toBe(400);
		}
		expect(await stored(lot.id)).toEqual(before);
	});

	it('refuses another role (403) and a lot already on the bench (409)', async () => {
		const lot = await createLot(buyer, { partNumber: PART, quantity: 100, declaredSoc: 0.3 });
		expect((await page(lot.id, inspectorCookie)).status).toBe(403);
		expect((await postForm(app.url, `/lots/${lot.id}/edit`, await editFields(), inspectorCookie)).status).toBe(403);

		const saved = await call(inspector, `/api/v1/lots/${lot.id}/readings`, {
			body: { readings: modelReadings('NMC', 2, 0.3, { prefix: 'ED' }) }
		});
		expect(saved.status).toBe(201);
		const before = await stored(lot.id);
		const refused = await page(lot.id, buyerCookie);
		expect(refused.status).toBe(409);
		// One true sentence and the way back to the lot — no claim of a concurrent change.
		const html = await refused.text();
		expect(html).toContain('its purchase facts can no longer change');
		expect(html).toContain(`href="/lots/${lot.id}"`);
		expect(html).not.toContain('at the same time');
		expect((await postForm(app.url, `/lots/${lot.id}/edit`, await editFields(), buyerCookie)).status).toBe(409);
		expect(await stored(lot.id)).toEqual(before);
	});
});
