/**
 * A quality manager sets up a TOTP second factor through the real pages in Chromium (the code
 * computed from the key the page shows, as an authenticator app would), then signs in again with
 * password and code. Screenshots: the set-up step with its QR code, the factor on, the code step.
 */
import { expect, test } from '@playwright/test';
import { startApp, type RunningApp } from '../helpers/app';
import { freshDatabase } from '../helpers/db';
import { screens } from '../helpers/screens';
import { signInPage, signInPageWithCode, totpCode } from '../helpers/auth';

const QUALITY = 'quality@kestrel-mobility.example';

let app: RunningApp;
let db: { url: string; drop: () => Promise<void> };
const shot = screens('second-factor');

test.beforeAll(async () => {
	db = await freshDatabase('e2e_second_factor');
	app = await startApp({ databaseUrl: db.url });
});

test.afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

test('a quality manager enrols from the header menu, then signs in with password and code', async ({ page }) => {
	await signInPage(page, app.url, QUALITY);
	await page.getByRole('banner').getByRole('link', { name: 'Sign-in security' }).click();
	await expect(page).toHaveURL(`${app.url}/account/security`);
	await expect(page.getByTestId('factor-state')).toContainText('○ Off');
	await page.getByRole('button', { name: 'Set up' }).click();

	const qr = page.getByRole('img', { name: 'QR code holding your Restvolt sign-in key' });
	await expect(qr).toBeVisible();
	expect(await qr.evaluate((img: HTMLImageElement) => img.naturalWidth)).toBeGreaterThan(0);
	const secret = (await page.getByTestId('totp-secret').textContent())!.trim();
	expect(secret).toMatch(/^([A-Z2-7]{4} ){7}[A-Z2-7]{4}$/);
	await shot(page, 'set-up');

	await page.getByLabel('Password').fill('restvolt-demo-2026');
	await page.getByLabel('6-digit code').fill(totpCode(secret));
	await page.getByRole('button', { name: 'Turn on' }).click();
	await expect(page.getByTestId('factor-state')).toContainText('● On');
	await expect(page.getByText('Your second factor is on.')).toBeVisible();
	await shot(page, 'on');

	await page.getByRole('button', { name: 'Sign out' }).click();
	await expect(page).toHaveURL(`${app.url}/signin?signed-out`);
	await page.getByLabel('Work e-mail').fill(QUALITY);
	await page.getByLabel('Password').fill('restvolt-demo-2026');
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByRole('heading', { name: 'Second step: the code from your app' })).toBeVisible();
	await shot(page, 'code-step');
	// Start again, then the whole sign-in through the helper (the enrolment used this step's code).
	await page.getByRole('button', { name: 'Start again' }).click();
	await expect(page.getByRole('heading', { name: 'Staff sign-in' })).toBeVisible();
	await signInPageWithCode(page, app.url, QUALITY, () => totpCode(secret, 1));
	await expect(page).toHaveURL(`${app.url}/review`);
});
