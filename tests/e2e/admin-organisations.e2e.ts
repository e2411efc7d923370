/**
 * An administrator edits an organisation (name, address, a notice contact) in Chromium; each change
 * appears in the page's history with who made it, and is in the audit trail. A name another
 * organisation holds is refused on the name field. Screenshots go to tests/artifacts/screens/admin.
 */
import { expect, test } from '@playwright/test';
import { startApp, type RunningApp } from '../helpers/app';
import { freshDatabase, withClient } from '../helpers/db';
import { screens } from '../helpers/screens';
import { signInPage } from '../helpers/auth';

let app: RunningApp;
let db: { url: string; drop: () => Promise<void> };
const shot = screens('admin-organisations');

test.beforeAll(async () => {
	db = await freshDatabase('e2e_admin_orgs', { demo: false });
	app = await startApp({ databaseUrl: db.url });
});

test.afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

test('an organisation is edited and each change shows in its history', async ({ page, browser }) => {
	const [a, b] = await withClient(
		db.url,
		async (c) => (await c.query(`select id, name from organisations where kind = 'supplier' order by name limit 2`)).rows
	);
	await signInPage(page, app.url, 'admin@kestrel-mobility.example');
	await page.goto(`${app.url}/admin/organisations`);
	await page.getByRole('link', { name: a.name, exact: true }).click();
	await expect(page.getByRole('heading', { level: 1 })).toHaveText(a.name);

	await page.getByLabel('Company name').fill(b.name);
	await page.getByRole('button', { name: 'Save details' }).click();
	await expect(page.getByText('Another organisation has this name')).toBeVisible();

	await page.getByLabel('Company name').fill(`${a.name} Ltd`);
	await page.getByLabel('Address').fill('Unit 4, Harbour Lane\nPortmere 4410');
	await page.getByRole('button', { name: 'Save details' }).click();
	await expect(page.getByRole('status').filter({ hasText: 'name, address changed' })).toBeVisible();

	await page.getByLabel('Name', { exact: true }).fill('Mira Okafor');
	await page.getByLabel('E-mail').fill('mira@orders.example');
	await page
		.getByRole('button', { name: /Save|Add/ })
		.last()
		.click();
	await expect(page.getByRole('listitem').filter({ hasText: 'mira@orders.example' }).first()).toBeVisible();

	await page.reload();
	const history = page.getByRole('list', { name: 'Changes, newest first' });
	await expect(history.getByRole('listitem').first()).toContainText('Added the notice contact “mira@orders.example”');
	await expect(history.getByRole('listitem').nth(1)).toContainText(
		`Changed name from “${a.name}” to “${a.name} Ltd”; address from empty to “Unit 4, Harbour Lane, Portmere 4410”`
	);
	await expect(history.getByRole('listitem').nth(1)).toContainText('(Administrator)');
	await expect(page.getByLabel('Address')).toHaveValue('Unit 4, Harbour Lane\nPortmere 4410');
	await shot(page, 'organisation-edited');

	const audited = await withClient(
		db.url,
		async (c) =>
			(await c.query(`select count(*)::int as n from audit_events where action = 'organisation.updated' and entity_id = $1`, [a.id]))
				.rows[0].n
	);
	expect(audited).toBe(1);

	// Buyers see the new address on the supplier's page.
	const buyer = await browser.newContext();
	const buyerPage = await buyer.newPage();
	await signInPage(buyerPage, app.url, 'buyer@kestrel-mobility.example');
	await buyerPage.goto(`${app.url}/suppliers/${a.id}`);
	await expect(buyerPage.locator('address')).toHaveText('Unit 4, Harbour Lane\nPortmere 4410');
	await shot(buyerPage, 'supplier-page-address');
	await buyer.close();
});
