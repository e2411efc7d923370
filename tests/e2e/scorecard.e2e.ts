/**
 * The supplier scorecard in Chromium: the period filter (last 90 days, last 12 months, a custom
 * from–to) changes what is counted; the XLSX and PDF exports download with the period chosen; the
 * comparison shows suppliers side by side for one chemistry. Lots are placed on known days.
 * Screenshots go to tests/artifacts/screens/scorecard.
 */
import { expect, test, type Page } from '@playwright/test';
import { startApp, type RunningApp } from '../helpers/app';
import { freshDatabase, withClient } from '../helpers/db';
import { screens } from '../helpers/screens';
import { signInPage } from '../helpers/auth';

let app: RunningApp;
let db: { url: string; drop: () => Promise<void> };
const shot = screens('scorecard');
let supplierA = '';
let supplierAName = '';
let supplierBName = '';

const isoDay = (daysAgo: number) => new Date(Date.now() - daysAgo * 86_400_000).toISOString().slice(0, 10);

test.beforeAll(async () => {
	db = await freshDatabase('e2e_scorecard', { demo: false });
	app = await startApp({ databaseUrl: db.url });
	await withClient(db.url, async (c) => {
		const first = (
			await c.query(
				`select p.id, p.supplier_id, o.name from parts p join organisations o on o.id = p.supplier_id where p.chemistry = 'NMC' order by p.part_number limit 1`
			)
		).rows[0];
		const other = (
			await c.query(`select id, name from organisations where kind = 'supplier' and id <> $1 order by name limit 1`, [first.supplier_id])
		).rows[0];
		const copy = (
			await c.query(
				`insert into parts select (jsonb_populate_record(null::parts, to_jsonb(p) || jsonb_build_object('id', gen_random_uuid(), 'supplier_id', $2::uuid, 'part_number', 'CMP-NMC-2'))).*
				   from parts p where p.id = $1 returning id`,
				[first.id, other.id]
			)
		).rows[0];
		supplierA = first.supplier_id;
		supplierAName = first.name;
		supplierBName = other.name;
		const lots: Array<[string, string, number]> = [
			[first.id, 'accepted', 10],
			[first.id, 'rejected', 200],
			[first.id, 'accepted', 500],
			[copy.id, 'on_hold', 30]
		];
		for (const [i, [partId, status, daysAgo]] of lots.entries()) {
			await c.query(
				`insert into lots (lot_code, po_number, supplier_id, part_id, quantity, declared_soc, transport, status, created_at, decided_at)
				 select $1, $2, p.supplier_id, p.id, 1200, 0.3, 'road', $3::lot_status, now() - ($4 || ' days')::interval, now() - ($4 || ' days')::interval
				   from parts p where p.id = $5`,
				[`L-1997-${String(i + 1).padStart(5, '0')}`, `PO-CARD-${i + 1}`, status, String(daysAgo), partId]
			);
		}
	});
});

test.afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

const received = (page: Page) => page.locator('[data-tile="received"] dd').first();

test('the period filter changes what is counted, and the exports follow it', async ({ page }) => {
	await signInPage(page, app.url, 'quality@kestrel-mobility.example');
	await page.goto(`${app.url}/suppliers/${supplierA}/scorecard`);
	await expect(received(page)).toHaveText('3');
	await expect(page.getByText('Counting every lot since the first.')).toBeVisible();

	await page.locator('select[name="period"]').selectOption({ label: 'Last 90 days' });
	await page.getByRole('button', { name: 'Show' }).click();
	await page.waitForURL(/period=90d/);
	await expect(received(page)).toHaveText('1');

	await page.locator('select[name="period"]').selectOption({ label: 'Last 12 months' });
	await page.getByRole('button', { name: 'Show' }).click();
	await page.waitForURL(/period=12m/);
	await expect(received(page)).toHaveText('2');
	await expect(page.locator('[data-tile="acceptance"] dd').first()).toHaveText('50.0\u00a0%');

	await page.locator('select[name="period"]').selectOption({ label: 'From – to' });
	await page.getByLabel('From (first day)').fill(isoDay(210));
	await page.getByLabel('To (last day)').fill(isoDay(190));
	await page.getByRole('button', { name: 'Show' }).click();
	await page.waitForURL(/period=custom/);
	await expect(received(page)).toHaveText('1');
	await expect(page.getByText(`${isoDay(210)} to ${isoDay(190)} (UTC, both days included)`)).toBeVisible();
	await shot(page, 'scorecard-custom-period');

	const xlsx = page.waitForEvent('download');
	await page.getByRole('link', { name: 'Export XLSX' }).click();
	expect((await xlsx).suggestedFilename()).toBe('scorecard.xlsx');
	const pdf = page.waitForEvent('download');
	await page.getByRole('link', { name: 'Export PDF' }).click();
	const pdfFile = await pdf;
	expect(pdfFile.suggestedFilename()).toBe('scorecard.pdf');
	expect(pdfFile.url()).toContain(`from=${isoDay(210)}`);

	// A custom period with its days in the wrong order is refused by name.
	const answer = await page.request.get(
		`${app.url}/api/v1/suppliers/${supplierA}/scorecard.xlsx?period=custom&from=${isoDay(1)}&to=${isoDay(9)}`
	);
	expect(answer.status()).toBe(400);
	expect(JSON.stringify(await answer.json())).toContain('"to"');
});

test('suppliers side by side for one chemistry', async ({ page }) => {
	await signInPage(page, app.url, 'quality@kestrel-mobility.example');
	await page.goto(`${app.url}/suppliers`);
	await page.getByRole('link', { name: 'Compare suppliers' }).click();
	await expect(page.getByText('Choose a chemistry or a part number')).toBeVisible();
	await page.getByLabel('Chemistry').selectOption('NMC');
	await page.locator('select[name="period"]').selectOption({ label: 'Last 12 months' });
	await page.getByRole('button', { name: 'Compare' }).click();
	const table = page.getByRole('table', { name: 'Suppliers side by side' });
	await expect(table.getByRole('row').filter({ hasText: supplierAName })).toContainText('50.0');
	const b = table.getByRole('row').filter({ hasText: supplierBName });
	await expect(b).toContainText('CMP-NMC-2');
	await expect(b.getByRole('cell').nth(2)).toHaveText('1');
	await shot(page, 'compare-suppliers');
});
