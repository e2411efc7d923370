/**
 * Quality reviews a held lot in Chromium and releases it with an e-signature (reason + password),
 * choosing the disposition itself (nothing is pre-selected); the engine's hold and its safety
 * reject sent the supplier nothing. The supplier then reads the one notice in the portal, opens the PDF report, acknowledges the notice
 * and replies with a corrective-action document, which the buyer sees on the lot page.
 * Screenshots go to tests/artifacts/screens/review; the report and tag PDFs are saved beside them.
 */
import { expect, test } from '@playwright/test';
import { execFileSync } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { startApp, type RunningApp } from '../helpers/app';
import { freshDatabase, withClient } from '../helpers/db';
import { screens } from '../helpers/screens';
import { signInPage, signInSupplierByLink, tokenFor } from '../helpers/auth';
import { measuredLot, waitUntil } from '../integration/decisions-fixtures';
import { call, createLot, type Caller } from '../integration/readings-fixtures';

let app: RunningApp;
let db: { url: string; drop: () => Promise<void> };
const shot = screens('review');
const artefacts = resolve(import.meta.dirname, '../artifacts/screens/review');
let held: { id: string; lot_code: string };
let other: { id: string; lot_code: string };
let ferrolithLot: { id: string; lot_code: string };
let buyer: Caller;

test.beforeAll(async () => {
	db = await freshDatabase('e2e_review', { demo: false });
	app = await startApp({ databaseUrl: db.url });
	const as = async (email: string): Promise<Caller> => ({ base: app.url, token: await tokenFor(db.url, email) });
	buyer = await as('buyer@kestrel-mobility.example');
	const inspector = await as('inspector@kestrel-mobility.example');
	held = await measuredLot(buyer, inspector, 'hold');
	other = await measuredLot(buyer, inspector, 'safety');
	ferrolithLot = await createLot(buyer, { partNumber: 'FL-PR-100', quantity: 50, declaredSoc: 0.3 });
	for (const lot of [held, other]) await call(inspector, `/api/v1/lots/${lot.id}/submit`, { method: 'POST' });
});

test.afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

/** Save a PDF from the API and render its first page as PNG (poppler) for a person to look at. */
async function savePdf(request: import('@playwright/test').APIRequestContext, path: string, name: string) {
	const res = await request.get(`${app.url}${path}`);
	expect(res.status()).toBe(200);
	const file = resolve(artefacts, `${name}.pdf`);
	writeFileSync(file, await res.body());
	execFileSync('pdftoppm', ['-png', '-r', '60', file, resolve(artefacts, name)]);
}

test('quality releases a held lot with an e-signature', async ({ page }) => {
	await signInPage(page, app.url, 'quality@kestrel-mobility.example');
	await page.goto(`${app.url}/review`);
	const item = page.locator(`[data-lot-code="${held.lot_code}"]`);
	await expect(item).toContainText('Missing: UN 38.3 test summary');
	await expect(item.getByTestId('proposal')).toContainText('Engine proposes hold');
	// The engine's safety reject waits here too, quarantined, until quality confirms it.
	const safetyItem = page.locator(`[data-lot-code="${other.lot_code}"]`);
	await expect(safetyItem.getByTestId('proposal')).toContainText('Engine proposes reject');
	await expect(safetyItem.getByTestId('proposal')).toContainText('safety finding');
	// In the app, quality sees how many lots wait for it beside "Hold review".
	const waiting = page.getByRole('navigation', { name: 'Main' }).getByTestId('nav-count');
	await expect(waiting).toHaveText(/^2\s*waiting$/);
	await shot(page, 'review-queue');

	await item.getByRole('link', { name: held.lot_code }).click();
	await expect(page.getByRole('heading', { name: `Lot ${held.lot_code}`, exact: true })).toBeVisible();
	await expect(page.getByRole('heading', { name: 'Plots' })).toBeVisible();
	await expect(page.locator('svg').first()).toBeVisible();

	// No disposition is chosen for the manager; signing without one is refused.
	const dispositions = page.getByRole('radio');
	await expect(dispositions).toHaveCount(5);
	await expect(page.getByRole('radio', { checked: true })).toHaveCount(0);
	await shot(page, 'review-form-nothing-chosen');
	await page.getByLabel(/^Reason/).fill('UN 38.3 summary received by mail and checked');
	await page.getByLabel('Your password (signature)').fill('restvolt-demo-2026');
	await page.getByRole('button', { name: 'Sign disposition and notify supplier' }).click();
	await expect(page.getByText('Choose a disposition')).toBeVisible();
	// A disposition that asks something of the supplier asks for a due date.
	await page.getByLabel('Return to supplier').check();
	await expect(page.getByLabel('Supplier to act by')).toBeVisible();
	await shot(page, 'review-form-return-due-date');

	// Without the right password nothing is signed.
	await page.getByLabel('Release', { exact: false }).first().check();
	await expect(page.getByLabel('Supplier to act by')).toHaveCount(0);
	await page.getByLabel(/^Reason/).fill('UN 38.3 summary received by mail and checked');
	await page.getByLabel('Your password (signature)').fill('wrong-password');
	await page.getByRole('button', { name: 'Sign disposition and notify supplier' }).click();
	await expect(page.getByText('The password is not correct; nothing was decided.')).toBeVisible();
	await shot(page, 'review-wrong-password');

	// The signature is bound to the lot as shown: a document arriving meanwhile moves the lot on,
	// the signature is refused, and the reloaded page signs the lot as it now stands.
	await expect(page.getByText(`bound to lot ${held.lot_code} as shown here`)).toBeVisible();
	const form = new FormData();
	form.set('kind', 'other');
	form.set('file', new Blob([Buffer.from(`%PDF-1.4\n% supplier letter ${held.id}\n%%EOF\n`)], { type: 'application/pdf' }), 'letter.pdf');
	expect((await call(buyer, `/api/v1/lots/${held.id}/documents`, { form })).status).toBe(201);
	await page.getByLabel('Your password (signature)').fill('restvolt-demo-2026');
	await page.getByRole('button', { name: 'Sign disposition and notify supplier' }).click();
	await expect(page.getByTestId('decision-message')).toContainText('The lot changed since the signing challenge was issued');
	// The page reloads with fresh challenges for the lot's new revision before it signs again.
	const revision = await withClient(
		db.url,
		async (c) => (await c.query('select revision from lots where id = $1', [held.id])).rows[0].revision
	);
	await expect(page.getByText(`revision ${revision}; sign before`)).toBeVisible();
	await shot(page, 'review-lot-changed');

	// The reloaded form starts over: the manager reviews the lot again and signs anew.
	await page.getByLabel('Release', { exact: false }).first().check();
	await page.getByLabel(/^Reason/).fill('UN 38.3 summary received by mail and checked; supplier letter read');
	await page.getByLabel('Your password (signature)').fill('restvolt-demo-2026');
	await page.getByRole('button', { name: 'Sign disposition and notify supplier' }).click();
	await expect(page.getByTestId('decision-message')).toContainText('release; the lot is now accepted');
	await expect(page.getByRole('button', { name: 'Sign disposition and notify supplier' })).toHaveCount(0);
	await shot(page, 'review-released');
	const status = await withClient(db.url, async (c) => (await c.query('select status from lots where id = $1', [held.id])).rows[0].status);
	expect(status).toBe('accepted');
	// The manifest names the page's challenge, which is now used, and a content hash.
	const { signature, used } = await withClient(db.url, async (c) => {
		const row = (await c.query(`select signature from decisions where lot_id = $1 and kind = 'override'`, [held.id])).rows[0];
		const challenge = (await c.query('select used_at from signature_challenges where id = $1', [row.signature.challenge_id])).rows[0];
		return { signature: row.signature, used: challenge?.used_at };
	});
	expect(signature.content_sha256).toMatch(/^[0-9a-f]{64}$/);
	expect(used).toBeTruthy();

	// The released lot has left the queue; the safety reject still waits for quality.
	await page.goto(`${app.url}/review`);
	await expect(page.locator(`[data-lot-code="${held.lot_code}"]`)).toHaveCount(0);
	await expect(page.locator(`[data-lot-code="${other.lot_code}"]`)).toHaveCount(1);
	await expect(waiting).toHaveText(/^1\s*waiting$/);

	await savePdf(page.request, `/api/v1/lots/${held.id}/report.pdf`, 'report-released');
	await savePdf(page.request, `/api/v1/lots/${other.id}/quarantine-tag.pdf`, 'tag-safety-reject');
	await savePdf(page.request, `/api/v1/lots/${other.id}/report.pdf`, 'report-safety-reject');
});

test('the supplier reads the notice and the report, acknowledges and replies', async ({ page }) => {
	await waitUntil(
		async () => {
			const rows = await withClient(
				db.url,
				async (c) => (await c.query(`select status from notices where lot_id = $1 and kind <> 'alert'`, [held.id])).rows
			);
			return rows.length === 1 && rows.every((r) => r.status === 'sent');
		},
		20_000,
		'notices sent'
	);
	await signInSupplierByLink(page, app.url, 'supplier@voltaria-cells.example');
	await expect(page.getByRole('heading', { name: 'Your lots and notices' })).toBeVisible();
	await shot(page, 'portal-home');

	await page.getByRole('link', { name: held.lot_code }).click();
	await expect(page.getByRole('heading', { name: `Lot ${held.lot_code}`, exact: true })).toBeVisible();
	const notices = page.getByTestId('portal-notice');
	await expect(notices).toHaveCount(1);
	await expect(notices.first()).toContainText('Quality decision');
	await expect(notices.first()).not.toContainText('on hold for your review'); // quality's alert stays internal
	const report = await page.request.get(`${app.url}/api/v1/lots/${held.id}/report.pdf?inline=1`);
	expect(report.status()).toBe(200);
	expect(report.headers()['content-type']).toBe('application/pdf');
	await shot(page, 'portal-lot');

	const holdNotice = notices.first();
	await holdNotice.getByRole('button', { name: 'Acknowledge this notice' }).click();
	await expect(holdNotice.getByText(/Acknowledged/)).toBeVisible();
	await holdNotice.getByLabel(/^Reply to/).fill('Our UN 38.3 summary for this cell type is attached; the shipping desk has been reminded.');
	await holdNotice.getByLabel(/^Document/).setInputFiles({
		name: 'corrective-action.pdf',
		mimeType: 'application/pdf',
		buffer: Buffer.from('%PDF-1.4\n% corrective action for the missing summary\n%%EOF\n')
	});
	await holdNotice.getByRole('button', { name: 'Send reply' }).click();
	await expect(holdNotice.getByText('Reply sent.')).toBeVisible();
	await expect(holdNotice.getByRole('link', { name: 'corrective-action.pdf' })).toBeVisible();
	await shot(page, 'portal-replied');

	// Another supplier's lot is simply not there for this supplier.
	const foreign = await page.goto(`${app.url}/portal/lots/${ferrolithLot.id}`);
	expect(foreign?.status()).toBe(404);
	const report2 = await page.request.get(`${app.url}/api/v1/lots/${ferrolithLot.id}/report.pdf`);
	expect(report2.status()).toBe(404);
});

test('the buyer sees the decisions, notices and the reply on the lot page', async ({ page }) => {
	await signInPage(page, app.url, 'buyer@kestrel-mobility.example');
	await page.goto(`${app.url}/lots/${held.id}`);
	const panel = page.getByRole('region', { name: 'Disposition and paper trail' });
	await expect(panel).toContainText('Quality decision');
	await expect(panel).toContainText('e-signed');
	await expect(panel).toContainText('Our UN 38.3 summary for this cell type is attached');
	await expect(panel.getByRole('link', { name: 'corrective-action.pdf' })).toBeVisible();
	await panel.scrollIntoViewIfNeeded();
	await shot(page, 'lot-decision-panel');
});

test('quality confirms the safety reject: only return or scrap, with a due date; then the supplier is told', async ({ page }) => {
	await signInPage(page, app.url, 'quality@kestrel-mobility.example');
	await page.goto(`${app.url}/review/${other.id}`);
	await expect(page.getByRole('note').first()).toContainText('cannot be released');
	for (const label of ['Release', 'Use as is under a deviation', 'Sort or rework']) {
		await expect(page.getByRole('radio', { name: new RegExp(label) })).toBeDisabled();
	}
	await expect(page.getByRole('radio', { checked: true })).toHaveCount(0);
	await page.getByRole('radio', { name: /Scrap/ }).check();
	const due = new Date(Date.now() + 14 * 86_400_000).toISOString().slice(0, 10);
	await page.getByLabel('Supplier to act by').fill(due);
	await page.getByLabel(/^Reason/).fill('Deep-discharged cell in the sample: the lot is scrapped through the licensed recycler.');
	await page.getByLabel('Your password (signature)').fill('restvolt-demo-2026');
	await shot(page, 'review-safety-scrap');
	await page.getByRole('button', { name: 'Sign disposition and notify supplier' }).click();
	await expect(page.getByTestId('decision-message')).toContainText('scrap; the lot is now rejected');
	await shot(page, 'review-safety-scrapped');
	const notices = await withClient(
		db.url,
		async (c) => (await c.query(`select kind, body_text from notices where lot_id = $1 and kind <> 'alert'`, [other.id])).rows
	);
	expect(notices).toHaveLength(1);
	expect(notices[0].body_text).toContain(`Issue a credit note for the scrapped lot to our buyer by ${due}.`);
	expect(notices[0].body_text).toMatch(/: 2\.000 V, rested below its minimum safe voltage/);
	await savePdf(page.request, `/api/v1/lots/${other.id}/quarantine-tag.pdf`, 'tag-safety-reject');
});

test('the buyer reads the supplier scorecard, rendered by the server', async ({ page }) => {
	const supplierId = await withClient(
		db.url,
		async (c) => (await c.query('select supplier_id from lots where id = $1', [held.id])).rows[0].supplier_id
	);
	await signInPage(page, app.url, 'buyer@kestrel-mobility.example');
	// The server sends the figures and the chart in the page itself, before any script runs.
	const served = await (await page.request.get(`${app.url}/suppliers/${supplierId}/scorecard`)).text();
	expect(served).toContain('Trend per month');
	expect(served).toContain('38,462');
	await page.goto(`${app.url}/suppliers/${supplierId}/scorecard`);
	await expect(page.getByRole('heading', { name: 'Voltaria Cells Co.' })).toBeVisible();
	// Two lots decided on original inspection: one held (then released), one rejected for safety.
	const tile = (key: string) => page.locator(`[data-tile="${key}"]`);
	await expect(tile('received')).toContainText('2');
	await expect(tile('acceptance')).toContainText('0.0 %');
	await expect(tile('held')).toContainText('1 released after review');
	await expect(tile('rejected')).toContainText('1 rejected in the end');
	// 1 deep-discharged unit of 26 inspected: 1/26 × 10⁶ ≈ 38,462 ppm.
	await expect(tile('ppm')).toContainText('38,462 ppm');
	await expect(page.getByRole('heading', { name: 'Trend per month' })).toBeVisible();
	await shot(page, 'scorecard-supplier');
	await page.getByLabel('Part', { exact: true }).selectOption({ label: 'VC-21700-50G' });
	await expect(page.getByRole('heading', { name: 'Voltaria Cells Co. · VC-21700-50G' })).toBeVisible();
	await expect(page.getByText('Sampling severity now')).toBeVisible();
	await shot(page, 'scorecard-part');
});

test('an administrator retries a notice that gave up', async ({ page }) => {
	const [notice] = await withClient(
		db.url,
		async (c) =>
			(
				await c.query(
					`update notices set status = 'failed', attempts = 8, last_error = 'relay refused (set by the test)' where lot_id = $1 and kind = 'override' returning id`,
					[other.id]
				)
			).rows
	);
	await signInPage(page, app.url, 'admin@kestrel-mobility.example');
	await page.goto(`${app.url}/admin/outbox`);
	const row = page.locator(`tr[data-notice-id="${notice.id}"]`);
	await expect(row).toContainText('relay refused (set by the test)');
	await shot(page, 'outbox-failed');
	await row.getByRole('button', { name: 'Retry now' }).click();
	await expect(page.getByText('The notice is queued again')).toBeVisible();
	await waitUntil(
		async () => {
			const [r] = await withClient(db.url, async (c) => (await c.query('select status from notices where id = $1', [notice.id])).rows);
			return r.status === 'sent';
		},
		20_000,
		'retried notice sent'
	);
	await page.getByRole('button', { name: 'Refresh' }).click();
	await expect(page.locator(`tr[data-notice-id="${notice.id}"]`)).toHaveCount(1); // now under "Recently sent"
	await shot(page, 'outbox-after-retry');
});
