/**
 * The SOC uncertainty as a user sees it: the lot page of the demo's LFP lot on the bench says what
 * limits its SOC estimates, in plain words, and the register form asks how the
 * cells were last moved. Screenshots go to tests/artifacts/screens/soc-limits.
 */
import { expect, test } from '@playwright/test';
import { startApp, type RunningApp } from '../helpers/app';
import { freshDatabase, withClient } from '../helpers/db';
import { screens } from '../helpers/screens';
import { signInPage } from '../helpers/auth';

let app: RunningApp;
let db: { url: string; drop: () => Promise<void> };
const shot = screens('soc-limits');

test.beforeAll(async () => {
	db = await freshDatabase('e2e_soc_limits');
	app = await startApp({ databaseUrl: db.url });
});

test.afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

test('the lot page says what limits the SOC estimates; the lot form asks for the last direction', async ({ page, browser }) => {
	const lotId = await withClient(db.url, async (c) => {
		const r = await c.query<{ id: string }>(`select id from lots where lot_code = 'L-2026-00021'`);
		return r.rows[0].id;
	});
	await signInPage(page, app.url, 'quality@kestrel-mobility.example');
	await page.goto(`${app.url}/lots/${lotId}`);
	const box = page.getByRole('region', { name: 'What limits the SOC estimates' });
	await expect(box).toBeVisible();
	await expect(box.getByText(/Typical 1σ per cell/)).toBeVisible();
	await box.scrollIntoViewIfNeeded();
	await shot(page, 'lfp-lot-soc-limits');

	const buyer = await (await browser.newContext()).newPage();
	await signInPage(buyer, app.url, 'buyer@kestrel-mobility.example');
	await buyer.goto(`${app.url}/lots/new`);
	const direction = buyer.getByLabel('Last charged or discharged?');
	await expect(direction).toHaveValue('unknown');
	await direction.selectOption('after_charge');
	await shot(buyer, 'register-last-direction');
});
