/**
 * Packs on the bench: the inspector opens the demo's 10s4p pack lot, sees the weakest-group deep
 * discharge the seed's BMS readout shows, and types the ten group voltages of a unit already measured.
 * Screenshots go to tests/artifacts/screens/cell-groups. The lot, part and serials are invented.
 */
import { expect, test } from '@playwright/test';
import { startApp, type RunningApp } from '../helpers/app';
import { freshDatabase, withClient } from '../helpers/db';
import { screens } from '../helpers/screens';
import { signInPage } from '../helpers/auth';

let app: RunningApp;
let db: { url: string; drop: () => Promise<void> };
const shot = screens('cell-groups');

test.beforeAll(async () => {
	db = await freshDatabase('e2e_cell_groups');
	app = await startApp({ databaseUrl: db.url });
});

test.afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

test('an inspector types the cell-group voltages of a measured pack', async ({ page }) => {
	const lotId = await withClient(db.url, async (c) => (await c.query(`select id from lots where lot_code = 'L-2026-00024'`)).rows[0].id);
	await signInPage(page, app.url, 'inspector@kestrel-mobility.example');
	await page.goto(`${app.url}/lots/${lotId}/inspect`);
	await expect(page.getByTestId('server-evaluation').getByText(/weakest cell group: VCEB36-024-00003 group 6 at 2\.100 V/)).toBeVisible();
	const entry = page.getByTestId('cell-groups-entry');
	await entry.getByText('Cell groups (10 in series)').click();
	await entry.getByLabel('Serial', { exact: true }).fill('VCEB36-024-00001');
	await entry.getByLabel(/Group voltages, V/).fill('3.594 3.595 3.594 3.595 3.590 3.594 3.596 3.594 3.593 3.593');
	await entry.getByRole('button', { name: 'Save groups' }).click();
	await expect(entry.getByRole('status').filter({ hasText: 'VCEB36-024-00001' })).toContainText('lowest group 3.590');
	await shot(page, 'bench-cell-groups');
	const [row] = await withClient(
		db.url,
		async (c) => (await c.query(`select cell_group_voltages from readings where lot_id = $1 and serial = 'VCEB36-024-00001'`, [lotId])).rows
	);
	expect(row.cell_group_voltages).toHaveLength(10);
});

test('at 1440 px the pack bench keeps Save and the saved/imported mark of each stored row in view (issue 22 item 7)', async ({ page }) => {
	await page.setViewportSize({ width: 1440, height: 900 });
	const lotId = await withClient(db.url, async (c) => (await c.query(`select id from lots where lot_code = 'L-2026-00024'`)).rows[0].id);
	await signInPage(page, app.url, 'inspector@kestrel-mobility.example');
	await page.goto(`${app.url}/lots/${lotId}/inspect`);
	const save = page.getByTestId('entry-row').getByRole('button', { name: /^Save/ });
	await expect(save).toBeInViewport({ ratio: 1 });
	const mark = page
		.getByTestId('stored-row')
		.first()
		.locator('td', { hasText: /✓\s+(imported|saved)/ });
	await expect(mark).toBeVisible();
	// Within the width of the window (the row may sit partly below the fold; nothing is cut off at the side).
	const box = (await mark.boundingBox())!;
	expect(box.x + box.width).toBeLessThanOrEqual(1440);
	// Nothing of the page scrolls sideways at this width.
	expect(await page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)).toBe(true);
	await shot(page, 'pack-bench-1440');
});
