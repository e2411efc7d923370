/**
 * The bench's entry guard in Chromium: 36.5 typed for a cell part whose window is 3.00–4.18 V (the
 * invented demo part VC-21700-50G) is not sent; the bench asks "Did you mean 3.65 V?" and Enter takes
 * the fix. A value that is right though outside the window (0.9 V) is saved after a confirmation and
 * stored marked. Margins: Restvolt's own choice (src/lib/inspection/entry-guard.ts).
 * Screenshots: tests/artifacts/screens/entry-guard.
 */
import { expect, test } from '@playwright/test';
import { startApp, type RunningApp } from '../helpers/app';
import { signInPage, tokenFor } from '../helpers/auth';
import { freshDatabase, withClient } from '../helpers/db';
import { screens } from '../helpers/screens';
import { createLot, type Caller } from '../integration/readings-fixtures';

let app: RunningApp;
let db: { url: string; drop: () => Promise<void> };
let buyer: Caller;
const shot = screens('entry-guard');

test.beforeAll(async () => {
	db = await freshDatabase('e2e_entry_guard', { demo: false });
	app = await startApp({ databaseUrl: db.url });
	buyer = { base: app.url, token: await tokenFor(db.url, 'buyer@kestrel-mobility.example') };
});

test.afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

const storedOcv = (lotId: string, serial: string) =>
	withClient(db.url, async (c) => {
		const { rows } = await c.query<{ ocv_v: number; confirmed_out_of_window: boolean }>(
			'select ocv_v, confirmed_out_of_window from readings where lot_id = $1 and serial = $2',
			[lotId, serial]
		);
		return rows;
	});

test('36.5 is questioned and Enter takes 3.65 V; a confirmed 0.9 V is stored marked', async ({ page }) => {
	const lot = await createLot(buyer, { partNumber: 'VC-21700-50G', quantity: 50, declaredSoc: 0.3, documents: ['coc'] });
	await signInPage(page, app.url, 'inspector@kestrel-mobility.example');
	await page.goto(`${app.url}/lots/${lot.id}/inspect`);
	await expect(page.getByLabel('Serial')).toBeFocused();

	await page.keyboard.type('EG-E2E-001');
	await page.keyboard.press('Enter');
	await page.keyboard.type('36.5');
	await page.keyboard.press('Tab');
	await page.keyboard.type('22');
	await page.keyboard.press('Enter');
	const doubt = page.getByTestId('entry-doubt');
	await expect(doubt).toContainText('36.5 V is far outside 3.00–4.18 V. Did you mean 3.65 V');
	await expect(page.getByRole('button', { name: 'Use 3.65 V' })).toBeFocused();
	await shot(page, 'did-you-mean');
	await page.keyboard.press('Enter');
	await expect(doubt).toHaveCount(0);
	await expect(page.getByTestId('bench-row').first()).toHaveAttribute('data-state', 'saved');
	expect(await storedOcv(lot.id, 'EG-E2E-001')).toEqual([{ ocv_v: 3.65, confirmed_out_of_window: false }]);

	await expect(page.getByLabel('Serial')).toBeFocused();
	await page.keyboard.type('EG-E2E-002');
	await page.keyboard.press('Enter');
	await page.keyboard.type('0.9');
	await page.keyboard.press('Enter');
	await expect(doubt).toContainText('0.9 V is far outside 3.00–4.18 V. Check the value; if it is right, confirm it.');
	await page.getByRole('button', { name: 'The value is right: save 0.9 V' }).click();
	await expect(page.getByTestId('bench-row').first()).toHaveAttribute('data-state', 'saved');
	expect(await storedOcv(lot.id, 'EG-E2E-002')).toEqual([{ ocv_v: 0.9, confirmed_out_of_window: true }]);
	await expect(page.getByTestId('bench-row').first().getByTestId('confirmed-mark')).toHaveText('value confirmed outside window');
	await shot(page, 'confirmed-out-of-window');

	// Correcting a saved row: the correction row takes focus (OCV field) and Escape closes it.
	await page.getByRole('button', { name: 'Correct reading EG-E2E-001' }).click();
	await expect(page.getByLabel('OCV (V)', { exact: true })).toBeFocused();
	await page.keyboard.press('Escape');
	await expect(page.getByTestId('correction-row')).toHaveCount(0);
});
