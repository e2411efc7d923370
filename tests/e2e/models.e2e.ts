/**
 * Engineers explore a chemistry's OCV model in Chromium: the curve follows the temperature, a pasted
 * reference curve is fitted in the browser with residuals, and a quality manager saves the fit as a
 * new model version and approves it. Screenshots go to tests/artifacts/screens/models/.
 */
import { expect, test, type Page } from '@playwright/test';
import { curve, getLibraryModel, type ChemistryCode } from '../../src/lib/electrochem';
import { startApp, type RunningApp } from '../helpers/app';
import { DEMO_PASSWORD, signInPage } from '../helpers/auth';
import { freshDatabase } from '../helpers/db';
import { screens } from '../helpers/screens';

let app: RunningApp;
let db: { url: string; drop: () => Promise<void> };
const shot = screens('models');

test.beforeAll(async () => {
	db = await freshDatabase('e2e_models');
	app = await startApp({ databaseUrl: db.url });
});

test.afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

/**
 * A reference curve as a datasheet would give it: SOC in %, every 5 %, 4 decimals of volts, with a
 * deterministic ±0.8 mV ripple standing in for measurement noise (invented data).
 */
function referenceCsv(code: ChemistryCode, temperatureC = 25, distort = (_soc: number) => 0): string {
	const points = curve(getLibraryModel(code), temperatureC, 21);
	const lines = points.map((p, i) => {
		const ripple = 0.0008 * (i % 2 === 0 ? 1 : -1);
		return `${Math.round(p.soc * 100)},${(p.ocv_v + ripple + distort(p.soc)).toFixed(4)}`;
	});
	return ['SOC (%),OCV (V)', ...lines].join('\n');
}

async function pasteReference(page: Page, csv: string) {
	await page.getByLabel('Reference curve (per cell)').fill(csv);
}

test('an engineer explores LFP, changes the temperature and sees a pasted curve fitted', async ({ page }) => {
	await page.setViewportSize({ width: 1360, height: 900 });
	await signInPage(page, app.url, 'inspector@kestrel-mobility.example');
	await page.goto(`${app.url}/models`);
	await expect(page.getByRole('heading', { name: 'Chemistry library' })).toBeVisible();
	// LFP's 2.0 V deep-discharge floor (common practice) as the library states it
	await expect(page.getByRole('row', { name: /^LFP Lithium iron phosphate/ })).toContainText('2.00 V');
	await shot(page, 'model-list');

	await page.getByRole('link', { name: 'LFP', exact: true }).click();
	await expect(page).toHaveURL(/\/models\/LFP$/);
	await expect(page.getByRole('heading', { level: 1 })).toContainText('LFP');
	const chart = page.locator('svg[role="img"]').first();
	await expect(chart.locator('.model-curve')).toHaveAttribute('d', /^M/);
	await expect(chart.locator('.min-safe-line')).toHaveCount(1);
	// LFP's flat mid-range: the page says so instead of pretending OCV can place SOC there
	await expect(page.getByText(/nearly flat/)).toBeVisible();
	const pathAt25 = await chart.locator('.model-curve').getAttribute('d');
	await shot(page, 'lfp-at-25c');

	await page.getByLabel('Cell temperature (°C)').fill('5');
	await expect(page.getByText(/5\s°C is outside the range this model is valid for/)).toBeVisible();
	await expect(chart.locator('.model-curve')).not.toHaveAttribute('d', pathAt25!);
	await expect(page.locator('aside')).toContainText('at 5 °C');
	await shot(page, 'lfp-at-5c');

	await pasteReference(page, referenceCsv('LFP'));
	await expect(page.getByText('21 points read; SOC read as %.')).toBeVisible();
	await expect(page.getByTestId('fit-verdict')).toContainText('Fit accepted');
	await expect(page.getByTestId('fit-rmse')).toHaveText(/^\d+\.\d\d\smV$/); // number and unit joined by a no-break space ($lib/format)
	await expect(chart.locator('.fit-curve')).toHaveCount(1);
	// one residual marker (a square) per reference point under the main plot
	await expect(chart.locator('.residuals [data-shape="square"]')).toHaveCount(21);
	// an inspector may look, but saving a model version is the quality manager's job
	await expect(page.getByRole('button', { name: /Save as a new model version/ })).toHaveCount(0);
	await shot(page, 'lfp-fit');

	await page.getByText('Fitted parameters and residuals').click();
	await expect(page.getByRole('cell', { name: '50.0 %' })).toBeVisible();
	await shot(page, 'lfp-fit-residual-table');
});

test('a quality manager saves a fitted NMC version and approves it; a non-monotonic curve is refused', async ({ page }) => {
	await page.setViewportSize({ width: 1360, height: 900 });
	await signInPage(page, app.url, 'quality@kestrel-mobility.example');
	await page.goto(`${app.url}/models/NMC`);

	await pasteReference(
		page,
		referenceCsv('NMC', 25, (soc) => -0.15 * Math.sin(2 * Math.PI * soc))
	);
	await expect(page.getByTestId('fit-verdict')).toContainText('Fit rejected');
	await expect(page.getByRole('button', { name: 'Save as a new model version for NMC' })).toBeDisabled();
	await shot(page, 'nmc-rejected-fit');

	await pasteReference(page, referenceCsv('NMC'));
	await page.getByLabel('Label for the new version (optional)').fill('in-house C/20 discharge');
	await expect(page.getByTestId('fit-verdict')).toContainText('Fit accepted');
	await page.getByRole('button', { name: 'Save as a new model version for NMC' }).click();
	await expect(page).toHaveURL(/\/models\/NMC\?model=[0-9a-f-]{36}&saved=1/);
	await expect(page.getByRole('status').filter({ hasText: 'awaits a quality manager’s approval' })).toBeVisible();
	await expect(page.getByRole('heading', { level: 1 })).toContainText('in-house C/20 discharge');
	await shot(page, 'nmc-saved-awaiting');

	// The author may not approve their own version (four eyes): the form says so and nothing changes.
	const savedUrl = page.url();
	const sign = page.getByRole('form', { name: /^Sign the approval of NMC fit-/ });
	await sign.getByLabel('Reason').fill('Checked against our C/20 discharge');
	await sign.getByLabel('Your password (signs)').fill(DEMO_PASSWORD);
	await sign.getByRole('button', { name: /^Approve NMC fit-/ }).click();
	await expect(page.getByText('another quality manager must approve it. Nothing was approved.')).toBeVisible();
	await shot(page, 'nmc-author-cannot-approve');

	// The other quality manager signs the approval with a reason and their password.
	await page.context().clearCookies();
	await signInPage(page, app.url, 'quality2@kestrel-mobility.example');
	await page.goto(savedUrl);
	await sign.getByLabel('Reason').fill('Fit residuals checked; C/20 data from our lab book 7, p. 12');
	await sign.getByLabel('Your password (signs)').fill(DEMO_PASSWORD);
	await sign.getByRole('button', { name: /^Approve NMC fit-/ }).click();
	await expect(page.getByText('Approved. Parts may now use this version.')).toBeVisible();
	await expect(page.locator('header').getByText('Approved', { exact: true })).toBeVisible(); // src/lib/status.ts MODEL_STATUS
	await shot(page, 'nmc-approved');

	await page.goto(`${app.url}/models`);
	const row = page.getByRole('row', { name: /fit-1/ });
	await expect(row).toContainText('Approved');
	await expect(row).toContainText('quality2@kestrel-mobility.example'); // the approver, not the author
	await shot(page, 'model-list-with-fitted');
});
