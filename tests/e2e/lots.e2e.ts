/**
 * A buyer registers a lot through the real pages in Chromium: field errors, the air-transport
 * caution for lithium-ion, documents (a PDF attached, the same PDF refused as already attached, a
 * text file named .pdf refused), release for arrival, and the lot in the list. Quality edits a
 * part's limits; suppliers and parts pages render. Screenshots go to tests/artifacts/screens/lots.
 */
import { expect, test, type Page } from '@playwright/test';
import { startApp, type RunningApp } from '../helpers/app';
import { freshDatabase, withClient } from '../helpers/db';
import { screens } from '../helpers/screens';
import { signInPage, tokenFor } from '../helpers/auth';

let app: RunningApp;
let db: { url: string; drop: () => Promise<void> };
const shot = screens('lots');

test.beforeAll(async () => {
	db = await freshDatabase('e2e_lots');
	app = await startApp({ databaseUrl: db.url });
});

test.afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

const PDF = Buffer.from('%PDF-1.4\n1 0 obj <<>> endobj\ntrailer <<>>\n%%EOF\n');

async function attach(page: Page, kind: string, name: string, bytes: Buffer) {
	await page.getByLabel('Kind').selectOption({ label: kind });
	await page.getByLabel(/^File/).setInputFiles({ name, mimeType: 'application/pdf', buffer: bytes });
	await page.getByRole('button', { name: 'Attach' }).click();
}

test('a buyer registers a lot with documents and releases it', async ({ page }) => {
	await signInPage(page, app.url, 'buyer@kestrel-mobility.example');
	await page.goto(`${app.url}/lots?search=no-such-po`);
	await expect(page.getByText('No lots match these filters.')).toBeVisible();
	await shot(page, 'lots-none-match');

	await page.getByRole('link', { name: 'Register a lot' }).first().click();
	await expect(page.getByRole('heading', { name: 'Register a lot' })).toBeVisible();
	// A new form starts empty, not at 0.
	await expect(page.getByLabel('Quantity (units)')).toHaveValue('');
	await page.getByRole('button', { name: 'Save draft lot' }).click();
	await expect(page.getByText('Enter the purchase order number')).toBeVisible();
	await expect(page.getByText('Choose a supplier', { exact: true })).toBeVisible();
	await expect(page.getByText('Choose air, sea, road or rail')).toBeVisible();
	await shot(page, 'register-field-errors');

	await page.getByLabel('PO number').fill('PO-2026-0417');
	await page.getByLabel('Quantity (units)').fill('1200');
	await page.getByLabel('Supplier').selectOption({ label: 'Voltaria Cells Co.' });
	await page.getByLabel('Part').selectOption({ label: 'VC-18650-35E — NMC 18650-size cell, 3.5 Ah' });
	await page.getByLabel('Declared SOC at shipment (%)').fill('45');
	await page.getByLabel('Transport', { exact: true }).selectOption('air');
	const caution = page.getByRole('note', { name: 'Air transport caution' });
	await expect(caution).toContainText('no more than 30 %');
	await expect(caution).toContainText('declared at 45 %, above that limit');
	await expect(caution).toContainText('current dangerous-goods regulations');
	// A lithium part needs its UN number: the server (and the form) say so on the field.
	await page.getByRole('button', { name: 'Save draft lot' }).click();
	await expect(page.getByText('A lithium shipment needs its UN number (UN3480 or UN3481)')).toBeVisible();
	await shot(page, 'register-air-lithium-caution');

	await page.getByLabel(/^UN number/).fill('UN3480');
	await page.getByLabel(/^Expected arrival/).fill('2026-05-04');
	await page.getByRole('button', { name: 'Save draft lot' }).click();
	await page.waitForURL(/\/lots\/[0-9a-f-]{36}\?registered=1$/);
	await expect(page.getByRole('heading', { level: 1 })).toHaveText(/^L-\d{4}-\d{5}$/);
	await expect(page.locator('[data-status="draft"]').first()).toHaveText('Draft');
	await expect(page.getByRole('note', { name: 'Air transport caution' })).toBeVisible();
	await expect(page.getByTestId('missing-documents')).toContainText('Certificate of conformity, UN 38.3 test summary, Safety data sheet');
	await expect(page.getByText('Code letter J')).toBeVisible(); // 1,200 units at level II → J (ISO 2859-1 Table I: 501–1,200)
	await shot(page, 'lot-draft');

	await attach(page, 'Certificate of conformity', 'coc-po-0417.pdf', PDF);
	await expect(page.getByRole('link', { name: 'coc-po-0417.pdf' })).toBeVisible();
	await expect(page.getByTestId('missing-documents')).toContainText('UN 38.3 test summary, Safety data sheet');

	await attach(page, 'Other', 'copy.pdf', PDF);
	await expect(page.getByTestId('upload-message')).toContainText('This file is already attached as “coc-po-0417.pdf”');

	await attach(page, 'Safety data sheet', 'sds.pdf', Buffer.from('Safety data sheet, plain text'));
	await expect(page.getByTestId('upload-message')).toContainText('“sds.pdf” is named .pdf but is a text file');
	await shot(page, 'lot-documents-refused');

	const download = page.waitForEvent('download');
	await page.getByRole('link', { name: 'coc-po-0417.pdf' }).click();
	expect((await download).suggestedFilename()).toBe('coc-po-0417.pdf');

	await page.getByRole('button', { name: 'Release for arrival' }).click();
	await expect(page.locator('h1 + [data-status]')).toHaveText('Awaiting arrival');
	await expect(page.getByRole('button', { name: 'Release for arrival' })).toHaveCount(0);
	await expect(page.getByRole('region', { name: 'History' }).getByText('Released for arrival')).toBeVisible();
	await shot(page, 'lot-released');

	await page.goto(`${app.url}/lots`);
	const row = page.getByRole('table', { name: 'Lots' }).getByRole('row').filter({ hasText: 'PO-2026-0417' });
	await expect(row).toHaveCount(1);
	await expect(row.locator('[data-status]')).toHaveText('Awaiting arrival');
	await shot(page, 'lots-list');

	const rows = await withClient(db.url, (c) =>
		c.query(`select status, declared_soc, un_number from lots where po_number = 'PO-2026-0417'`)
	);
	expect(rows.rows).toEqual([{ status: 'awaiting_arrival', declared_soc: 0.45, un_number: 'UN3480' }]);
});

test('the lot list pages through many lots and filters by status', async ({ page }) => {
	await withClient(db.url, async (c) => {
		const part = (await c.query(`select id, supplier_id from parts where part_number = 'PB-AGM-12-18'`)).rows[0];
		for (let i = 1; i <= 30; i++) {
			await c.query(
				`insert into lots (lot_code, po_number, supplier_id, part_id, quantity, declared_soc, transport, status, created_at)
				 values ($1, $2, $3, $4, 50, 0.9, 'road', $5, now() - ($6 || ' minutes')::interval)`,
				[
					`L-1999-${String(i).padStart(5, '0')}`,
					`PO-LEAD-${i}`,
					part.supplier_id,
					part.id,
					i % 3 === 0 ? 'cancelled' : 'awaiting_arrival',
					String(i)
				]
			);
		}
	});
	await signInPage(page, app.url, 'buyer@kestrel-mobility.example');
	await page.goto(`${app.url}/lots`);
	const table = page.getByRole('table', { name: 'Lots' });
	const total = await withClient(db.url, async (c) => Number((await c.query('select count(*) from lots')).rows[0].count));
	expect(total).toBeGreaterThan(25);
	await expect(table.locator('tbody tr')).toHaveCount(25);
	await page.getByRole('link', { name: 'Older lots →' }).click();
	await expect(page.getByText('Page 2 · newest first')).toBeVisible();
	await expect(table.locator('tbody tr')).toHaveCount(Math.min(25, total - 25));
	await page.getByRole('link', { name: '← Newer lots' }).click();
	await expect(page.getByText('Page 1 · newest first')).toBeVisible();

	await page.getByRole('combobox', { name: 'Status' }).selectOption({ label: 'Cancelled' });
	await page.getByRole('button', { name: 'Show lots' }).click();
	const cancelled = await withClient(db.url, async (c) =>
		Number((await c.query(`select count(*) from lots where status = 'cancelled'`)).rows[0].count)
	);
	expect(cancelled).toBeGreaterThanOrEqual(10);
	await expect(table.locator('tbody tr')).toHaveCount(Math.min(25, cancelled));
	await expect(table.locator('[data-status="cancelled"]')).toHaveCount(Math.min(25, cancelled));
	await page.getByLabel('Quick filter on this page').fill('PO-LEAD-3');
	await expect(table.locator('tbody tr')).toHaveCount(2); // PO-LEAD-3 and PO-LEAD-30
	await page.locator('summary', { hasText: 'Columns' }).click();
	await page.getByRole('checkbox', { name: 'Chemistry' }).check();
	await expect(table.getByRole('columnheader', { name: /Chemistry/ })).toBeVisible();
	await shot(page, 'lots-filtered');
});

test('quality edits a part’s limits; suppliers show contacts and severity', async ({ page }) => {
	await signInPage(page, app.url, 'quality@kestrel-mobility.example');
	await page.goto(`${app.url}/parts`);
	await page.getByRole('link', { name: 'FL-PR-100' }).click();
	await expect(page.getByRole('heading', { name: 'Acceptance limits and sampling' })).toBeVisible();
	await page.getByLabel('Spread limit (mV)').fill('35');
	await page.getByLabel('AQL (%)').selectOption('0.65');
	await page.getByRole('button', { name: 'Save limits' }).click();
	await expect(page.getByText('Limits and sampling saved.')).toBeVisible();
	await page.getByLabel('Highest OCV per cell (V)').fill('1.0');
	await page.getByRole('button', { name: 'Save limits' }).click();
	await expect(page.getByText('The highest OCV must be above the lowest')).toBeVisible();
	await shot(page, 'part-limits');
	const part = await withClient(db.url, (c) => c.query(`select spread_limit_mv, aql from parts where part_number = 'FL-PR-100'`));
	expect(part.rows[0]).toEqual({ spread_limit_mv: 35, aql: 0.65 });

	await page.goto(`${app.url}/suppliers`);
	await page.getByRole('link', { name: 'Voltaria Cells Co.' }).click();
	await expect(page.getByText('quality-desk@voltaria-cells.example')).toBeVisible();
	await expect(page.getByRole('table').getByText('Normal').first()).toBeVisible();
	await shot(page, 'supplier-detail');

	// A decided lot from the seeded scenario: the lot page carries the evaluation and decision panels.
	await page.goto(`${app.url}/lots?status=on_hold`);
	await page.getByRole('table', { name: 'Lots' }).getByRole('link').first().click();
	await expect(page.locator('h1 + [data-status]')).toHaveText('On hold');
	await expect(page.getByRole('heading', { name: 'Sampling plan' })).toBeVisible();
	await expect(page.getByRole('button', { name: 'Release for arrival' })).toHaveCount(0);
	await page.waitForLoadState('networkidle');
	await shot(page, 'lot-on-hold');
});

test('a buyer adds a supplier contact who receives notices', async ({ page }) => {
	await signInPage(page, app.url, 'buyer@kestrel-mobility.example');
	await page.goto(`${app.url}/suppliers`);
	await page.getByRole('link', { name: 'Ferrolith Energy' }).click();
	await page.getByLabel('Name').fill('Ferrolith returns desk');
	await page.getByLabel('E-mail').fill('not-an-address');
	await page.getByRole('button', { name: 'Add contact' }).click();
	await expect(page.getByText('Enter an e-mail address like name@company.example')).toBeVisible();
	await page.getByLabel('E-mail').fill('Returns@Ferrolith.example');
	await page.getByRole('button', { name: 'Add contact' }).click();
	await expect(page.getByText('returns@ferrolith.example')).toBeVisible();
	await shot(page, 'supplier-contact-added');
	const rows = await withClient(db.url, (c) =>
		c.query(`select name, receives_notices from supplier_contacts where email = 'returns@ferrolith.example'`)
	);
	expect(rows.rows).toEqual([{ name: 'Ferrolith returns desk', receives_notices: true }]);
});

test('a buyer corrects a lot’s quantity before arrival and the sampling plan follows', async ({ page }) => {
	const token = await tokenFor(db.url, 'buyer@kestrel-mobility.example');
	const api = (path: string, init: RequestInit = {}) =>
		fetch(`${app.url}${path}`, { ...init, headers: { authorization: `Bearer ${token}`, 'content-type': 'application/json' } });
	const parts = await (await api('/api/v1/parts')).json();
	const part = (parts.parts ?? parts).find((p: { part_number: string }) => p.part_number === 'VC-18650-35E');
	const created = await api('/api/v1/lots', {
		method: 'POST',
		body: JSON.stringify({
			po_number: 'PO-2026-0533',
			supplier_id: part.supplier_id,
			part_id: part.id,
			quantity: 1200,
			declared_soc: 0.3,
			transport: 'sea',
			un_number: 'UN3480'
		})
	});
	expect(created.status).toBe(201);
	const lot = await created.json();

	await signInPage(page, app.url, 'buyer@kestrel-mobility.example');
	await page.goto(`${app.url}/lots/${lot.id}`);
	await expect(page.getByText('Code letter J')).toBeVisible(); // ISO 2859-1 Table I, level II: 501–1,200 → J
	await page.getByRole('link', { name: 'Edit purchase facts' }).click();
	await expect(page.getByRole('heading', { name: `Edit lot ${lot.lot_code}` })).toBeVisible();
	await expect(page.getByLabel('Quantity (units)')).toHaveValue('1200');
	await expect(page.getByLabel('Declared SOC at shipment (%)')).toHaveValue('30');
	await page.getByLabel('Quantity (units)').fill('0');
	await page.getByRole('button', { name: 'Save changes' }).click();
	await expect(page.getByText(/at least 1/i)).toBeVisible();
	// The refused form also goes to the server, and its answer resets the fields: let it arrive first.
	await page.waitForLoadState('networkidle');
	await page.getByLabel('Quantity (units)').fill('1250');
	await shot(page, 'edit-lot');
	await page.getByRole('button', { name: 'Save changes' }).click();
	await expect(page.getByText('Changes saved')).toBeVisible();
	await expect(page.getByText('Code letter K')).toBeVisible(); // Table I, level II: 1,201–3,200 → K
});
