/**
 * The lots list keeps each person's columns and sort across reloads (stored on the server per
 * person, not in the browser), another person keeps their own; counts carry thousands separators
 * and the registration time names its zone; a new part's capacity starts empty.
 * Screenshots go to tests/artifacts/screens/lots-view.
 */
import { expect, test, type Page } from '@playwright/test';
import { startApp, type RunningApp } from '../helpers/app';
import { freshDatabase, withClient } from '../helpers/db';
import { screens } from '../helpers/screens';
import { signInPage } from '../helpers/auth';

let app: RunningApp;
let db: { url: string; drop: () => Promise<void> };
const shot = screens('lots-view');

test.beforeAll(async () => {
	db = await freshDatabase('e2e_lots_view');
	app = await startApp({ databaseUrl: db.url });
});

test.afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

const lotsTable = (page: Page) => page.getByRole('table', { name: 'Lots' });
const columnsMenu = (page: Page) => page.locator('details').filter({ has: page.getByText('Columns', { exact: true }) });

async function toggleColumn(page: Page, name: string) {
	const menu = columnsMenu(page);
	if (!(await menu.evaluate((d) => (d as HTMLDetailsElement).open))) await menu.getByText('Columns', { exact: true }).click();
	await menu.getByLabel(name, { exact: true }).click();
	await expect(page.getByRole('status').filter({ hasText: 'kept for your next visit' })).toBeVisible();
}

test('columns and sort are kept per person across reloads', async ({ page, browser }) => {
	await signInPage(page, app.url, 'buyer@kestrel-mobility.example');
	await page.goto(`${app.url}/lots`);
	const header = lotsTable(page).getByRole('columnheader');
	await expect(header.filter({ hasText: 'Registered' })).toHaveCount(0);
	await expect(header.filter({ hasText: 'Transport' })).toHaveCount(1);

	await toggleColumn(page, 'Registered');
	await toggleColumn(page, 'Transport');
	// A count column sorts largest first on the first click (TanStack's default for numbers).
	await page.getByRole('button', { name: /^Units/ }).click();
	await expect(header.filter({ hasText: 'Units' })).toHaveAttribute('aria-sort', 'descending');

	// The stored view is what the page sent last (observable before reloading).
	await expect
		.poll(() =>
			withClient(db.url, async (c) => {
				const { rows } = await c.query(
					`select p.value from user_preferences p join "user" u on u.id = p.user_id where u.email = $1 and p.key = 'lots-list'`,
					['buyer@kestrel-mobility.example']
				);
				return rows[0]?.value;
			})
		)
		.toEqual({ hidden: ['chemistry', 'transport'], sort: [{ id: 'quantity', desc: true }] });

	await page.reload();
	await expect(header.filter({ hasText: 'Registered' })).toHaveCount(1);
	await expect(header.filter({ hasText: 'Transport' })).toHaveCount(0);
	await expect(header.filter({ hasText: 'Units' })).toHaveAttribute('aria-sort', 'descending');
	const units = await lotsTable(page)
		.locator('tbody tr')
		.evaluateAll((rows) => {
			const head = [...document.querySelectorAll('table[aria-label="Lots"] thead th')].map((th) => th.textContent ?? '');
			const at = head.findIndex((t) => t.includes('Units'));
			return rows.map((r) => Number((r.children[at]?.textContent ?? '').replace(/,/g, '')));
		});
	expect(units.length).toBeGreaterThan(1);
	expect(units).toEqual([...units].sort((a, b) => b - a));
	// Quantities carry thousands separators and the registration time names its zone (src/lib/format.ts).
	expect(units.some((n) => n >= 1000)).toBe(true);
	await expect(
		lotsTable(page)
			.locator('tbody')
			.getByText(/^\d{1,3}(,\d{3})+$/)
			.first()
	).toBeVisible();
	await expect(
		lotsTable(page)
			.locator('tbody')
			.getByText(/^\d{4}-\d{2}-\d{2} \d{2}:\d{2} UTC$/)
			.first()
	).toBeVisible();
	await shot(page, 'lots-list-kept-view');

	// Another person's list is their own: the defaults, untouched by the buyer's choices.
	const other = await browser.newContext();
	const qualityPage = await other.newPage();
	await signInPage(qualityPage, app.url, 'quality@kestrel-mobility.example');
	await qualityPage.goto(`${app.url}/lots`);
	const otherHeader = lotsTable(qualityPage).getByRole('columnheader');
	await expect(otherHeader.filter({ hasText: 'Transport' })).toHaveCount(1);
	await expect(otherHeader.filter({ hasText: 'Registered' })).toHaveCount(0);
	await expect(otherHeader.filter({ hasText: 'Units' })).not.toHaveAttribute('aria-sort', /./);
	await other.close();
});

test('a view the server cannot read is refused, naming the field', async ({ page }) => {
	await signInPage(page, app.url, 'buyer@kestrel-mobility.example');
	await page.goto(`${app.url}/lots`);
	const answer = await page.evaluate(async () => {
		const body = new FormData();
		body.set('view', JSON.stringify({ hidden: ['lotCode'], sort: [] }));
		const r = await fetch('/lots?/view', { method: 'POST', body, headers: { 'x-sveltekit-action': 'true' } });
		return r.json();
	});
	expect(answer.type).toBe('failure');
	expect(answer.status).toBe(400);
	expect(answer.data).toContain('view');
});

test('a new part’s capacity starts empty, not at 0', async ({ page }) => {
	await signInPage(page, app.url, 'buyer@kestrel-mobility.example');
	await page.goto(`${app.url}/parts/new`);
	await expect(page.getByLabel('Nominal capacity (Ah)')).toHaveValue('');
	await shot(page, 'new-part-empty-capacity');
});
