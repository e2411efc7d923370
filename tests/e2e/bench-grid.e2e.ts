/**
 * The bench grid agrees with the server (issue 16): a unit typed far from the rest of its lot is
 * flagged "outlier" and "nonconforming" while typed (the browser runs the server's cores) and, once
 * saved, shows the same flags from the server's evaluation; it is never shown "in window". Arrow keys
 * move between rows and fields, Escape cancels the row, Ctrl+Z brings the last saved row back and
 * saves the fix as a correction with reason "undo" (audited). With the rejection number reached the
 * lot may be submitted before the sample is complete, and the decision says so.
 * The lot: the invented demo part VC-21700-50G, 50 units → sample 13, Ac 0 / Re 1 (ISO 2859-1:1999,
 * Table 1 letter D → Table 2-A at AQL 1.0, as the app's plan); readings from the part's seeded model.
 * Outlier rule: median/MAD (Restvolt's rule, src/lib/inspection/outliers.ts), condemned with n ≥ 8 and
 * more than the part's 40 mV spread limit from the median. Screenshots: tests/artifacts/screens/bench-grid.
 */
import { expect, test, type Page } from '@playwright/test';
import { ocvAt } from '../../src/lib/electrochem';
import { startApp, type RunningApp } from '../helpers/app';
import { signInPage, tokenFor } from '../helpers/auth';
import { freshDatabase, withClient } from '../helpers/db';
import { screens } from '../helpers/screens';
import { call, createLot, modelReadings, VC21_MODEL, type Caller } from '../integration/readings-fixtures';

let app: RunningApp;
let db: { url: string; drop: () => Promise<void> };
let buyer: Caller;
let inspector: Caller;
const shot = screens('bench-grid');

test.beforeAll(async () => {
	db = await freshDatabase('e2e_bench_grid', { demo: false });
	app = await startApp({ databaseUrl: db.url });
	buyer = { base: app.url, token: await tokenFor(db.url, 'buyer@kestrel-mobility.example') };
	inspector = { base: app.url, token: await tokenFor(db.url, 'inspector@kestrel-mobility.example') };
});

test.afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

/** A lot of 50 with `n` readings at 30 % SOC already stored through the API. */
async function lotWithReadings(prefix: string, n: number) {
	const lot = await createLot(buyer, {
		partNumber: 'VC-21700-50G',
		quantity: 50,
		declaredSoc: 0.3,
		documents: ['coc', 'un38_3_summary', 'sds']
	});
	const readings = modelReadings(VC21_MODEL, n, 0.3, { prefix, halfWidth: 0.005 });
	const saved = await call(inspector, `/api/v1/lots/${lot.id}/readings`, { body: { readings } });
	expect(saved.status).toBe(201);
	return { lot, readings };
}

async function openBench(page: Page, lotId: string) {
	await signInPage(page, app.url, 'inspector@kestrel-mobility.example');
	await page.goto(`${app.url}/lots/${lotId}/inspect`);
	await expect(page.getByLabel('Serial')).toBeFocused();
}

const sql = <T extends object>(text: string, values: unknown[]) =>
	withClient(db.url, async (c) => (await c.query<T & Record<string, unknown>>(text, values)).rows);

test('an outlier is flagged while typed and keeps the server’s flags once saved; the lot may be submitted early', async ({ page }) => {
	const { lot } = await lotWithReadings('BG-OUT', 11);
	await openBench(page, lot.id);
	// 60 % SOC on the part's model: inside the window, but far from the other eleven at 30 %.
	const far = Math.round(ocvAt(VC21_MODEL, 0.6, 25) * 10000) / 10000;
	await page.getByLabel('Serial').fill('BG-OUT-FAR');
	await page.getByLabel('OCV in volts').fill(far.toFixed(4));
	await page.getByLabel('Temperature in °C').fill('25');
	const entryFindings = page.getByTestId('entry-row').getByTestId('findings');
	await expect(entryFindings).toHaveAttribute('data-source', 'live');
	await expect(entryFindings.locator('[data-finding="outlier"]')).toBeVisible();
	await expect(entryFindings.locator('[data-finding="nonconforming"]')).toBeVisible();
	await expect(entryFindings.locator('[data-finding="in_window"]')).toHaveCount(0);
	await expect(page.getByTestId('bench-plots').locator('svg')).toHaveCount(2);
	await shot(page, 'outlier-while-typing');

	await page.getByLabel('Temperature in °C').press('Enter');
	const row = page.getByTestId('bench-row').filter({ hasText: 'BG-OUT-FAR' });
	await expect(row).toHaveAttribute('data-state', 'saved');
	const saved = row.getByTestId('findings');
	await expect(saved).toHaveAttribute('data-source', 'server');
	await expect(saved.locator('[data-finding="outlier"]')).toBeVisible();
	await expect(saved.locator('[data-finding="nonconforming"]')).toBeVisible();
	await expect(saved.locator('[data-finding="in_window"]')).toHaveCount(0);
	// Every unit the server counts nonconforming is shown so, by the server's own list.
	const evaluation = await call(inspector, `/api/v1/lots/${lot.id}/evaluation`);
	expect(evaluation.json.nonconforming_serials).toEqual(['BG-OUT-FAR']);
	const ncRow = page.locator('[data-serial="BG-OUT-FAR"]').getByTestId('findings');
	await expect(ncRow.locator('[data-finding="in_window"]')).toHaveCount(0);
	await expect(page.getByTestId('stored-row').first().getByTestId('findings')).toHaveAttribute('data-source', 'server');

	// Re 1 reached with 12 of 13 units: the lot may be submitted now, and the decision says it came early.
	await expect(page.getByTestId('server-status')).toHaveAttribute('data-status', 'reject');
	await expect(page.getByTestId('submit-lot-note')).toContainText('12 of 13 units measured');
	await expect(page.getByTestId('early-why')).toContainText('rejection number Re 1');
	await shot(page, 'server-outlier-early-submit');
	await page.getByTestId('submit-lot').click();
	await page.waitForURL(`${app.url}/lots/${lot.id}`);
	const [decision] = await sql<{ reason: string }>('select reason from decisions where lot_id = $1', [lot.id]);
	expect(decision.reason).toContain('Submitted early, with 12 of 13 sample units measured');
	expect(decision.reason).toContain('rejection number Re 1');
});

test('arrow keys move between rows and fields; Escape cancels; Ctrl+Z undoes the last saved row as an audited correction', async ({
	page
}) => {
	const { lot, readings } = await lotWithReadings('BG-KEY', 2);
	await openBench(page, lot.id);
	const serial = page.getByLabel('Serial');

	// Right from the end of the serial → OCV; left from its start → back to the serial.
	await page.keyboard.type('BG-KEY-X');
	await page.keyboard.press('ArrowRight');
	await expect(page.getByLabel('OCV in volts')).toBeFocused();
	await page.keyboard.press('ArrowLeft');
	await expect(serial).toBeFocused();
	// Down → the newest stored row's "correct"; down again → the next row; up twice → the entry row.
	await page.keyboard.press('ArrowDown');
	await expect(page.getByRole('button', { name: `Correct reading ${readings[1].serial}` })).toBeFocused();
	await page.keyboard.press('ArrowDown');
	await expect(page.getByRole('button', { name: `Correct reading ${readings[0].serial}` })).toBeFocused();
	await page.keyboard.press('Enter'); // opens the correction of that row
	await expect(page.getByTestId('correction-row')).toBeVisible();
	await page.keyboard.press('Escape');
	await expect(page.getByTestId('correction-row')).toHaveCount(0);
	await page.getByRole('button', { name: `Correct reading ${readings[0].serial}` }).focus();
	await page.keyboard.press('ArrowUp');
	await page.keyboard.press('ArrowUp');
	await expect(serial).toBeFocused();
	// Escape drops the half-typed row.
	await page.keyboard.press('Escape');
	await expect(serial).toHaveValue('');

	// A row saved with a slip (3.5 instead of 3.6050) …
	await page.keyboard.type('BG-KEY-UNDO');
	await page.keyboard.press('Enter');
	await page.keyboard.type('3.5');
	await page.keyboard.press('Tab');
	await page.keyboard.type('24');
	await page.keyboard.press('Enter');
	const row = page.getByTestId('bench-row').filter({ hasText: 'BG-KEY-UNDO' });
	await expect(row).toHaveAttribute('data-state', 'saved');
	await expect(serial).toBeFocused();
	// … comes back with Ctrl+Z; the fix is saved as a correction with reason "undo".
	await page.keyboard.press('Control+z');
	await expect(serial).toHaveValue('BG-KEY-UNDO');
	await expect(page.getByLabel('OCV in volts')).toBeFocused();
	await expect(page.getByTestId('undoing')).toContainText('Fixing saved reading BG-KEY-UNDO');
	await shot(page, 'undo');
	await page.keyboard.type('3.6050');
	await page.keyboard.press('Enter');
	await expect(row).toContainText('3.6050');
	await expect(page.getByTestId('undoing')).toHaveCount(0);
	const stored = await sql<{ id: number; ocv_v: number }>('select id, ocv_v from readings where lot_id = $1 and serial = $2', [
		lot.id,
		'BG-KEY-UNDO'
	]);
	expect(stored.map((r) => r.ocv_v)).toEqual([3.605]);
	const audit = await sql<{ reason: string; before: number; after: number }>(
		`select details->>'reason' as reason, (details->'before'->>'ocv_v')::float8 as before, (details->'after'->>'ocv_v')::float8 as after
		 from audit_events where action = 'reading.corrected' and entity_id = $1`,
		[String(stored[0].id)]
	);
	expect(audit).toEqual([{ reason: 'undo', before: 3.5, after: 3.605 }]);
});

test('validation messages are sentences about the value and go once it is fixed', async ({ page }) => {
	const { lot } = await lotWithReadings('BG-MSG', 1);
	await openBench(page, lot.id);
	await page.getByLabel('OCV in volts').fill('3.6050');
	await page.getByLabel('Temperature in °C').fill('warm');
	await page.getByLabel('Temperature in °C').press('Enter');
	await expect(page.getByTestId('problem-serial')).toHaveText('Serial is missing: scan or type the unit’s serial.');
	await expect(page.getByTestId('problem-temperature')).toHaveText('Temperature must be a number in °C, like 23.5; “warm” is not.');
	await shot(page, 'messages');
	await page.getByLabel('Serial').fill('BG-MSG-2');
	await expect(page.getByTestId('problem-serial')).toHaveCount(0);
	await page.getByLabel('Temperature in °C').fill('');
	await expect(page.getByTestId('problem-temperature')).toHaveText('Temperature is missing: type the cell or bench temperature in °C.');
	await page.getByLabel('Temperature in °C').fill('23');
	await expect(page.getByTestId('problem-temperature')).toHaveCount(0);
});

test('the meter import reads an unlabeled mV column as mV, says why, and says why Import waits', async ({ page }) => {
	const { lot } = await lotWithReadings('BG-IMP', 1);
	await openBench(page, lot.id);
	const rows = modelReadings(VC21_MODEL, 2, 0.3, { prefix: 'BG-IMP-F' });
	// No unit in the header and no temperature column: values like 3597.1 fit a 3.00–4.18 V cell only as mV.
	const csv = 'Serial,Voltage\n' + rows.map((r) => `${r.serial},${(r.ocv_v * 1000).toFixed(1)}`).join('\n') + '\n';
	await page.locator('input[type="file"]').setInputFiles({ name: 'unlabeled.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });
	await expect(page.getByLabel('OCV unit')).toHaveValue('mV');
	await expect(page.getByTestId('ocv-unit-note')).toContainText('fit this part (3.00–4.18 V) only as millivolts, so they are read as mV');
	await expect(page.getByTestId('import-blocked')).toHaveText(
		'Import is not available yet: Choose a Temperature column or the bench temperature first.'
	);
	await expect(page.getByRole('button', { name: /^Import \d+ reading/ })).toBeDisabled();
	await expect(page.getByText('(or one bench temperature)')).toBeVisible();
	await shot(page, 'import-mv-unlabeled');
	await page.getByLabel('Bench temperature °C (no column)').fill('24');
	await page.getByLabel('Bench temperature °C (no column)').blur();
	await expect(page.getByTestId('import-summary')).toContainText('2 valid of 2 rows · 0 error(s)');
	await expect(page.getByTestId('import-blocked')).toHaveCount(0);
	await page.getByRole('button', { name: 'Import 2 reading(s)' }).click();
	await expect(page.getByTestId('import-message')).toContainText('Imported 2 reading(s) from unlabeled.csv');
	const stored = await sql<{ ocv_v: number }>('select ocv_v from readings where lot_id = $1 and serial like $2 order by serial', [
		lot.id,
		'BG-IMP-F%'
	]);
	expect(stored).toHaveLength(2);
	stored.forEach((r, i) => expect(r.ocv_v).toBeCloseTo(rows[i].ocv_v, 6)); // mV ÷ 1000
});
