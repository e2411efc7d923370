/**
 * The bench on a 375 px phone (issue 16): the server's verdict and Submit stay in view without
 * scrolling (a sticky bar), the entry is a stacked card and the page does not scroll sideways.
 * The lot: the invented demo part VC-21700-50G, 50 units; readings from the part's seeded model.
 * Screenshots (viewport and full page): tests/artifacts/screens/bench-phone.
 */
import { expect, test } from '@playwright/test';
import { startApp, type RunningApp } from '../helpers/app';
import { signInPage, tokenFor } from '../helpers/auth';
import { freshDatabase } from '../helpers/db';
import { screens } from '../helpers/screens';
import { call, createLot, modelReadings, VC21_MODEL, type Caller } from '../integration/readings-fixtures';

let app: RunningApp;
let db: { url: string; drop: () => Promise<void> };
const shot = screens('bench-phone');

test.beforeAll(async () => {
	db = await freshDatabase('e2e_bench_phone', { demo: false });
	app = await startApp({ databaseUrl: db.url });
});

test.afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

test.use({ viewport: { width: 375, height: 740 }, hasTouch: true });

test('at 375 px the verdict and Submit are visible without scrolling and stay in view', async ({ page }) => {
	const buyer: Caller = { base: app.url, token: await tokenFor(db.url, 'buyer@kestrel-mobility.example') };
	const inspector: Caller = { base: app.url, token: await tokenFor(db.url, 'inspector@kestrel-mobility.example') };
	const lot = await createLot(buyer, {
		partNumber: 'VC-21700-50G',
		quantity: 50,
		declaredSoc: 0.3,
		documents: ['coc', 'un38_3_summary', 'sds']
	});
	const readings = modelReadings(VC21_MODEL, 6, 0.3, { prefix: 'PH' });
	expect((await call(inspector, `/api/v1/lots/${lot.id}/readings`, { body: { readings } })).status).toBe(201);

	await signInPage(page, app.url, 'inspector@kestrel-mobility.example');
	await page.goto(`${app.url}/lots/${lot.id}/inspect`);
	const bar = page.getByTestId('verdict-bar');
	await expect(bar.getByTestId('verdict-bar-status')).toHaveAttribute('data-status', 'pending');
	await expect(bar).toContainText('6/13');
	await expect(bar.getByTestId('submit-lot-phone')).toBeDisabled();
	await expect(bar).toBeInViewport({ ratio: 1 });
	await expect(page.getByLabel('Serial')).toBeInViewport();
	await page.screenshot({ path: 'tests/artifacts/screens/bench-phone/00-first-view.png' });

	// Nothing runs off the side: no sideways scroll.
	const wide = await page.evaluate(() =>
		[...document.querySelectorAll('body *')]
			.filter((el) => el.getBoundingClientRect().right > window.innerWidth + 1)
			.slice(0, 5)
			.map((el) => `${el.tagName}.${el.className}`)
	);
	const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
	expect(overflow, wide.join('\n')).toBeLessThanOrEqual(0);

	// Typed on the phone: the stacked card saves, and the bar follows the server.
	await page.getByLabel('Serial').fill('PH-NEW');
	await page.getByLabel('OCV in volts').fill(readings[0].ocv_v.toFixed(4));
	await page.getByLabel('Temperature in °C').fill('25');
	await page.getByRole('button', { name: 'Save ↵' }).click();
	await expect(page.getByTestId('bench-row').filter({ hasText: 'PH-NEW' })).toHaveAttribute('data-state', 'saved');
	await expect(bar).toContainText('7/13');

	// Scrolled down to the plots, the verdict is still in view.
	await page.getByTestId('bench-plots').scrollIntoViewIfNeeded();
	await expect(bar).toBeInViewport({ ratio: 1 });
	await page.screenshot({ path: 'tests/artifacts/screens/bench-phone/00-scrolled.png' });
	await shot(page, 'full-page');
});
