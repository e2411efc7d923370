/**
 * The whole Restvolt journey in Chromium, through the real pages only (the one shortcut: reading
 * mail from the local SMTP peer). One fresh app + database; each step is one person in a fresh
 * browser context:
 *   1. the administrator invites a buyer, an inspector and a quality manager; each sets a password
 *      through the e-mailed link;
 *   2. the new buyer adds a part and registers a lot (air, UN3480, declared 30 % SOC) with its CoC
 *      and UN 38.3 summary, and releases it for arrival;
 *   3. the new inspector records the sample: part by keyboard (serial + Enter, OCV, Tab, temperature,
 *      Enter), the rest from a CSV meter file (mapping → preview → import);
 *   4. submit → the lot is on hold (air-shipped lithium-ion whose readings do not show SOC at or below the 30 % limit); the
 *      engine only proposes, so the supplier hears nothing yet;
 *   5. the new quality manager signs a disposition (use as is under a deviation, with a due date)
 *      with reason + password (e-signature);
 *   6. the supplier gets exactly one notice, after that decision: signs in by e-mailed link, reads
 *      it and the PDF report, acknowledges and replies;
 *   7. the buyer sees the acknowledgement and the reply on the lot page.
 * Screenshots: tests/artifacts/screens/journey (with the report PDF and its first page as PNG).
 */
import { expect, test, type Browser, type Page } from '@playwright/test';
import { execFileSync } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { PDFDocument, StandardFonts } from 'pdf-lib';
import { startApp, type RunningApp } from '../helpers/app';
import { signInPage, signInSupplierByLink } from '../helpers/auth';
import { freshDatabase } from '../helpers/db';
import { readMail, waitForMail, type ReceivedMail } from '../helpers/mail';
import { screens } from '../helpers/screens';
import { evaluateReading, getLibraryModel, ocvAt } from '../../src/lib/electrochem';
import { AIR_SOC_LIMIT, samplingPlan } from '../../src/lib/inspection';
import { socStanding } from '../../src/lib/inspection/dangerous-goods';

test.describe.configure({ mode: 'serial' });

let app: RunningApp;
let db: { url: string; drop: () => Promise<void> };
const shot = screens('journey');
const artefacts = resolve(import.meta.dirname, '../artifacts/screens/journey');
const startedAt = Date.now() - 1000; // the shared mail peer keeps mail of earlier runs

const PEOPLE = {
	buyer: { email: 'elin.varga@kestrel-mobility.example', name: 'Elin Varga', role: 'Buyer', password: 'copper kettle on the night bench' },
	inspector: {
		email: 'teodor.lund@kestrel-mobility.example',
		name: 'Teodor Lund',
		role: 'Receiving inspector',
		password: 'seven cells wait in a quiet row'
	},
	quality: {
		email: 'priya.halden@kestrel-mobility.example',
		name: 'Priya Halden',
		role: 'Quality manager',
		password: 'the amber light means look twice'
	}
} as const;
const SUPPLIER = 'Voltaria Cells Co.';
const SUPPLIER_USER = 'supplier@voltaria-cells.example';
const PART = { number: 'VC-21700-42J', description: 'NMC 21700-size cell, 4.2 Ah, high-drain' };
const QUANTITY = 90;
const DECLARED_SOC = 0.3;
// New parts start at AQL 1.0, level II (schema defaults; quality owns them). ISO 2859-1 Table I:
// 51–90 units at level II → code letter E; Table II-A at AQL 1.0, E → n 13, Ac 0, Re 1.
const PLAN = samplingPlan({ lotSize: QUANTITY, aql: 1, level: 'II', severity: 'normal' });

/**
 * The sample, generated from the library NMC model (the same forward model the server inverts):
 * SOC 27–29 %. The new part has no model of its own, and on the generic NMC curve (its error
 * calibrated in SOC on published cells, about ±15 SOC points at 95 % here) each estimate is at or
 * below 30 % but its interval reaches well above it, so no reading shows ≤ 30 %: the air rule holds
 * the lot as unverified. Every unit is within the part's 60 mV residual tolerance of the OCV expected
 * at the declared 30 %, so none is nonconforming: a hold, not a reject.
 */
const NMC = getLibraryModel('NMC');
const SAMPLE = Array.from({ length: PLAN.sample_size }, (_, i) => {
	const soc = 0.27 + (0.02 * i) / (PLAN.sample_size - 1);
	const temperature_c = i < 4 ? 24 : 24.5;
	return { serial: `VC42J-${String(101 + i)}`, soc, temperature_c, ocv_v: Math.round(ocvAt(NMC, soc, temperature_c) * 10000) / 10000 };
});
const KEYED = SAMPLE.slice(0, 4);
const METER = SAMPLE.slice(4);
const unverifiedText = (n: number) => `for ${n} unit(s) the reading does not show SOC at or below 30 %`;
const HOLD_TEXT = unverifiedText(PLAN.sample_size);
/** The date quality gives the supplier to act by: two weeks from the run. */
const DUE_DATE = new Date(Date.now() + 14 * 86_400_000).toISOString().slice(0, 10);

let lot: { id: string; code: string };

test.beforeAll(async () => {
	db = await freshDatabase('e2e_journey');
	app = await startApp({ databaseUrl: db.url });
});

// eslint-disable-next-line no-empty-pattern -- Playwright passes fixtures first; this hook needs none
test.afterEach(async ({}, info) => {
	// A failed step shows what the server said (a 500 page alone says little).
	if (info.status !== info.expectedStatus && app) console.error(`--- app output (tail) ---\n${app.output().slice(-4000)}`);
});

test.afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

/** A small real PDF (pdf-lib), distinct per document. */
async function pdf(title: string, line: string): Promise<Buffer> {
	const doc = await PDFDocument.create();
	const font = await doc.embedFont(StandardFonts.Helvetica);
	const page = doc.addPage([420, 300]);
	page.drawText(title, { x: 30, y: 250, size: 16, font });
	page.drawText(line, { x: 30, y: 220, size: 10, font });
	return Buffer.from(await doc.save());
}

async function newestMail(to: string, subject: (s: string) => boolean): Promise<ReceivedMail> {
	const mails = await waitForMail((m) => m.envelope.to.includes(to) && subject(m.subject) && Number(m.id.split('-')[0]) >= startedAt);
	return mails.at(-1)!;
}

async function freshPage(browser: Browser): Promise<Page> {
	return (await browser.newContext()).newPage();
}

test('the readings behind the journey: a hold by the air rule, not a reject', () => {
	// Guard for the data above (same library model as the server): every unit estimated at or below 30 % SOC
	// but with an interval reaching above it (compliance not shown, not "within"), and within the part's
	// default residual tolerance (60 mV) of the OCV expected at 30 % → hold.
	for (const r of SAMPLE) {
		const u = evaluateReading(
			NMC,
			{ ocv_v: r.ocv_v, temperature_c: r.temperature_c },
			{ declared_soc: DECLARED_SOC, meter_accuracy_v: 0.002 }
		);
		expect(u.soc).toBeLessThanOrEqual(AIR_SOC_LIMIT);
		expect(socStanding(u, AIR_SOC_LIMIT)).toBe('unverified');
		expect(Math.abs(u.residual_v!)).toBeLessThan(0.06);
	}
	expect(PLAN).toMatchObject({ code_letter: 'E', sample_size: 13, accept: 0, reject: 1 });
});

test('1. the administrator invites three people, who set their passwords from the e-mailed link', async ({ page, browser }) => {
	await signInPage(page, app.url, 'admin@kestrel-mobility.example');
	await expect(page.getByRole('heading', { name: 'People' })).toBeVisible();
	await shot(page, 'admin-people');

	for (const person of Object.values(PEOPLE)) {
		await page.getByLabel('E-mail', { exact: true }).fill(person.email);
		await page.getByLabel('Name', { exact: true }).fill(person.name);
		await page.getByLabel('Role', { exact: true }).selectOption({ label: person.role });
		await page.getByLabel('Organisation', { exact: true }).selectOption({ label: 'Kestrel Mobility Ltd' });
		await page.getByRole('button', { name: 'Invite' }).click();
		await expect(page.getByRole('status')).toHaveText(`Invited ${person.email}. They received a link to choose a password.`);
		const row = page.getByRole('row').filter({ hasText: person.email });
		await expect(row).toContainText('Invited, no password yet');
		if (person === PEOPLE.buyer) await shot(page, 'admin-invited-buyer');
	}
	await shot(page, 'admin-invited-all');

	for (const person of Object.values(PEOPLE)) {
		const mail = await newestMail(person.email, (s) => s === 'You are invited to Restvolt');
		expect(mail.text).toContain(`Hello ${person.name},`);
		const link = /https?:\/\/\S+\/signin\/reset\/\S+/.exec(mail.text)?.[0];
		expect(link, 'set-password link in the invitation').toBeTruthy();
		const invitee = await freshPage(browser);
		await invitee.goto(link!);
		await expect(invitee.getByRole('heading', { name: 'Choose a password' })).toBeVisible();
		await expect(invitee.getByText(`For ${person.email}.`)).toBeVisible();
		await invitee.getByLabel('New password').fill(person.password);
		await invitee.getByLabel('The same password again').fill(person.password);
		if (person === PEOPLE.buyer) await shot(invitee, 'invitee-choose-password');
		await invitee.getByRole('button', { name: 'Set password' }).click();
		await expect(invitee.getByText('Your password is set. Sign in with it below.')).toBeVisible();
		if (person === PEOPLE.buyer) await shot(invitee, 'invitee-password-set');
		await invitee.context().close();
	}

	await page.reload();
	for (const person of Object.values(PEOPLE)) {
		await expect(page.getByRole('row').filter({ hasText: person.email })).toContainText('Password');
	}
	await shot(page, 'admin-people-with-passwords');
});

test('2. the new buyer adds a part, registers a lot with its documents and releases it', async ({ page }) => {
	await signInPage(page, app.url, PEOPLE.buyer.email, PEOPLE.buyer.password);
	await expect(page.getByRole('banner').getByText('Buyer', { exact: true })).toBeVisible();
	await expect(page.getByRole('banner')).toContainText(PEOPLE.buyer.name);

	await page.getByRole('banner').getByRole('link', { name: 'Parts' }).click();
	await page.getByRole('link', { name: 'Add a part' }).click();
	await expect(page.getByRole('heading', { name: 'Add a part' })).toBeVisible();
	await page.getByLabel('Supplier', { exact: true }).selectOption({ label: SUPPLIER });
	await page.getByLabel('Supplier part number').fill(PART.number);
	await page.getByLabel('Description').fill(PART.description);
	await page.getByLabel('Chemistry').selectOption('NMC');
	await page.getByLabel('Nominal capacity (Ah)').fill('4.2');
	await page.getByLabel('UN 38.3 test summary').check();
	await expect(page.getByLabel('Certificate of conformity')).toBeChecked();
	await shot(page, 'buyer-new-part');
	await page.getByRole('button', { name: 'Add part' }).click();
	await expect(page.getByRole('heading', { name: PART.number, level: 1 })).toBeVisible();
	await expect(page.getByText('Required documents: Certificate of conformity, UN 38.3 test summary')).toBeVisible();
	await expect(page.getByText('AQL 1 · inspection level II')).toBeVisible();
	await shot(page, 'buyer-part-added');

	await page.getByRole('banner').getByRole('link', { name: 'Register lot' }).click();
	await expect(page.getByRole('heading', { name: 'Register a lot' })).toBeVisible();
	await page.getByLabel('PO number').fill('PO-2026-0912');
	await page.getByLabel('Quantity (units)').fill(String(QUANTITY));
	await page.getByLabel('Supplier').selectOption({ label: SUPPLIER });
	await page.getByLabel('Part').selectOption({ label: `${PART.number} — ${PART.description}` });
	await page.getByLabel('Declared SOC at shipment (%)').fill(String(DECLARED_SOC * 100));
	await page.getByLabel('Transport', { exact: true }).selectOption('air');
	await page.getByLabel(/^UN number/).fill('UN3480');
	const caution = page.getByRole('note', { name: 'Air transport caution' });
	await expect(caution).toContainText('no more than 30 %');
	await expect(caution).toContainText('This lot is declared at 30 %.');
	await shot(page, 'buyer-register-lot');
	await page.getByRole('button', { name: 'Save draft lot' }).click();
	await page.waitForURL(/\/lots\/[0-9a-f-]{36}\?registered=1$/);
	const code = (await page.getByRole('heading', { level: 1 }).textContent())!.trim();
	expect(code).toMatch(/^L-\d{4}-\d{5}$/);
	lot = { id: new URL(page.url()).pathname.split('/')[2], code };
	await expect(page.locator('h1 + [data-status]')).toHaveText('Draft');
	await expect(page.getByText('Saved as a draft. Attach the documents below')).toBeVisible();
	await expect(page.getByTestId('missing-documents')).toContainText('Certificate of conformity, UN 38.3 test summary');
	const sampling = page.getByRole('region', { name: 'Sampling plan' });
	await expect(sampling).toContainText(`AQL 1 · level II`);
	await expect(sampling).toContainText(`Code letter ${PLAN.code_letter}`);
	await expect(sampling.getByText(String(PLAN.sample_size), { exact: true })).toBeVisible();
	await shot(page, 'buyer-lot-draft');

	const attach = async (kind: string, name: string, bytes: Buffer) => {
		await page.getByLabel('Kind').selectOption({ label: kind });
		await page.getByLabel(/^File/).setInputFiles({ name, mimeType: 'application/pdf', buffer: bytes });
		await page.getByRole('button', { name: 'Attach' }).click();
		await expect(page.getByRole('link', { name })).toBeVisible();
	};
	await attach(
		'Certificate of conformity',
		'coc-po-0912.pdf',
		await pdf('Certificate of conformity', `${PART.number}, PO-2026-0912, ${QUANTITY} units`)
	);
	await attach(
		'UN 38.3 test summary',
		'un38-3-summary-vc42j.pdf',
		await pdf('UN 38.3 test summary', `${PART.number}, tests T.1–T.8 passed`)
	);
	await expect(page.getByText('All required documents are attached.')).toBeVisible();
	await shot(page, 'buyer-lot-documents');

	await page.getByRole('button', { name: 'Release for arrival' }).click();
	await expect(page.locator('h1 + [data-status]')).toHaveText('Awaiting arrival');
	await expect(page.getByRole('region', { name: 'History' }).getByText('Released for arrival')).toBeVisible();
	await shot(page, 'buyer-lot-released');
});

async function typeRow(page: Page, r: { serial: string; ocv_v: number; temperature_c: number }) {
	await page.keyboard.type(r.serial);
	await page.keyboard.press('Enter'); // a scanner ends the serial with Enter → OCV
	await page.keyboard.type(r.ocv_v.toFixed(4));
	await page.keyboard.press('Tab');
	await page.keyboard.type(String(r.temperature_c));
	await page.keyboard.press('Enter'); // saves and starts the next unit
}

test('3. the new inspector records the sample by keyboard and from a meter file', async ({ page }) => {
	await signInPage(page, app.url, PEOPLE.inspector.email, PEOPLE.inspector.password);
	await expect(page).toHaveURL(`${app.url}/inspect`);
	const awaiting = page.getByRole('table', { name: 'Lots awaiting arrival' });
	await expect(awaiting.getByRole('row').filter({ hasText: lot.code })).toContainText(`${QUANTITY}`);
	await shot(page, 'inspector-bench-list');

	await page.getByRole('link', { name: `Start ${lot.code}` }).click();
	await page.waitForURL(`${app.url}/lots/${lot.id}/inspect`);
	await expect(page.getByRole('heading', { name: lot.code })).toBeVisible();
	await expect(page.getByText(`sample ${PLAN.sample_size} (Ac ${PLAN.accept} / Re ${PLAN.reject}, normal inspection)`)).toBeVisible();
	await expect(page.getByLabel('Serial')).toBeFocused();

	// First unit by keyboard, stopping before the final Enter to read the live feedback.
	const first = KEYED[0];
	const expected = evaluateReading(
		NMC,
		{ ocv_v: first.ocv_v, temperature_c: first.temperature_c },
		{ declared_soc: DECLARED_SOC, meter_accuracy_v: 0.002 }
	);
	await page.keyboard.type(first.serial);
	await page.keyboard.press('Enter');
	await expect(page.getByLabel('OCV in volts')).toBeFocused();
	await page.keyboard.type(first.ocv_v.toFixed(4));
	await page.keyboard.press('Tab');
	await expect(page.getByLabel('Temperature in °C')).toBeFocused();
	await page.keyboard.type(String(first.temperature_c));
	const entry = page.getByTestId('entry-row');
	// The generic curve cannot place this reading closely: the row says "indeterminate" with its interval.
	await expect(entry).toContainText(`indeterminate ${(expected.soc_low * 100).toFixed(0)}`);
	await expect(entry).toContainText(`${expected.expected_ocv_v!.toFixed(3)} V`); // OCV expected at the declared 30 %
	const residualMv = expected.residual_v! * 1000; // read below the declared 30 %: a negative residual, written with U+2212
	await expect(entry).toContainText(`${residualMv < 0 ? '\u2212' : '+'}${Math.abs(residualMv).toFixed(1)} mV`);
	// The row already says what the server will hold the lot for: ≤ 30 % SOC is not shown.
	await expect(entry.locator('[data-finding="air_limit_unverified"]')).toContainText('≤ 30 % not shown');
	await expect(entry.locator('[data-finding="in_window"]')).toHaveCount(0);
	await shot(page, 'inspector-live-feedback');
	await page.keyboard.press('Enter');
	await expect(page.getByTestId('bench-row').first()).toHaveAttribute('data-state', 'saved');
	const server = page.getByTestId('server-evaluation');
	await expect(server).toContainText(`1 of ${PLAN.sample_size}`);
	await expect(page.getByTestId('server-status')).toHaveAttribute('data-status', 'pending');
	await expect(server).toContainText('Sample incomplete');
	await expect(page.locator('h1 + [data-status]')).toHaveText('On the bench'); // the first reading records the arrival

	for (const r of KEYED.slice(1)) await typeRow(page, r);
	await expect(page.locator('[data-testid="bench-row"][data-state="saved"]')).toHaveCount(KEYED.length);
	await expect(server).toContainText(`${KEYED.length} of ${PLAN.sample_size}`);
	// The server already names the air-transport finding while the sample is incomplete.
	await expect(server.locator('[data-reason="dg_soc_unverified"]')).toContainText(unverifiedText(KEYED.length));
	await shot(page, 'inspector-keyed-rows');

	// The rest from the bench meter's CSV: its serial column has a name the guess does not know.
	const csv =
		'Cell;Reading (mV);Bench °C;Operator\n' +
		METER.map((r) => `${r.serial};${(r.ocv_v * 1000).toFixed(1)};${r.temperature_c};TL`).join('\n') +
		'\n';
	await page
		.getByLabel('Meter file', { exact: true })
		.setInputFiles({ name: 'meter-vc42j.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });
	await expect(page.getByLabel('Column for OCV')).toHaveValue('1');
	await expect(page.getByLabel('OCV unit')).toHaveValue('mV');
	await expect(page.getByTestId('import-summary')).toContainText(`0 valid of ${METER.length} rows`);
	await expect(page.getByTestId('mapping-missing')).toHaveText('▲ Choose the Serial column to see the readings.');
	await shot(page, 'inspector-import-mapping');
	await page.getByLabel('Column for Serial').selectOption({ label: 'A: Cell' });
	await expect(page.getByTestId('import-summary')).toContainText(`${METER.length} valid of ${METER.length} rows · 0 error(s)`);
	await expect(page.getByTestId('mapping-missing')).toHaveCount(0);
	const preview = page.getByRole('table', { name: 'Import preview' });
	await expect(preview.getByRole('row').filter({ hasText: METER[0].serial })).toContainText(METER[0].ocv_v.toFixed(4));
	await shot(page, 'inspector-import-preview');

	// Hold the upload a moment, so the progress line can be seen (and photographed). An intercepted
	// request reports no upload progress in Chromium, so the line stays at "uploading 0 %" here.
	await page.route('**/api/v1/lots/*/imports', async (route) => {
		await new Promise((r) => setTimeout(r, 800));
		await route.continue();
	});
	await page.getByRole('button', { name: `Import ${METER.length} reading(s)` }).click();
	await expect(page.getByTestId('meter-import').getByRole('status').first()).toContainText(/uploading \d+\s%|processing on the server…/);
	await expect(page.getByRole('button', { name: `Import ${METER.length} reading(s)` })).toBeDisabled(); // no double import while busy
	await shot(page, 'inspector-import-progress');
	await expect(page.getByTestId('import-message')).toHaveText(`Imported ${METER.length} reading(s) from meter-vc42j.csv.`);
	await page.unroute('**/api/v1/lots/*/imports');
	await expect(server).toContainText(`${PLAN.sample_size} of ${PLAN.sample_size}`);
	await expect(page.getByTestId('server-status')).toHaveAttribute('data-status', 'hold');
	await expect(page.getByTestId('server-status')).toHaveText('Hold'); // what the rules propose (src/lib/status.ts VERDICT)
	await expect(server.locator('[data-reason="dg_soc_unverified"]')).toContainText(HOLD_TEXT);
	await expect(server).toContainText(`0 nonconforming (Ac ${PLAN.accept} / Re ${PLAN.reject})`);
	await expect(page.getByText('The sample is complete.')).toBeVisible();
	await expect(page.locator('[data-finding="air_limit_unverified"]')).toHaveCount(PLAN.sample_size); // every row, typed or imported
	await shot(page, 'inspector-sample-complete');
});

test('4. the inspector submits the lot, which goes on hold with its reasons', async ({ page }) => {
	await signInPage(page, app.url, PEOPLE.inspector.email, PEOPLE.inspector.password);
	// The whole sample is measured, so the bench offers to submit it ("awaiting decision").
	await page.getByRole('link', { name: `Submit ${lot.code}` }).click();
	await expect(page.getByTestId('server-status')).toHaveAttribute('data-status', 'hold');
	await page.getByTestId('submit-lot').click();
	await page.waitForURL(`${app.url}/lots/${lot.id}`);
	await expect(page.locator('h1 + [data-status]')).toHaveText('On hold');
	await expect(page.getByTestId('evaluation-status')).toHaveAttribute('data-status', 'hold');
	await expect(page.getByTestId('evaluation-panel').locator('[data-reason="dg_soc_unverified"]')).toContainText(HOLD_TEXT);
	await expect(page.getByTestId('evaluation-panel')).toContainText(
		"Check the current dangerous-goods regulations and the site's procedure"
	);
	await expect(page.getByTestId('evaluation-panel').locator('svg').first()).toBeVisible();
	// Reached by client-side navigation (no load event for networkidle): wait for the paper trail instead.
	await expect(page.getByRole('region', { name: 'Disposition and paper trail' })).toContainText("waiting for quality's disposition");
	await shot(page, 'inspector-lot-on-hold');
});

test('5. the new quality manager reviews the hold and signs a disposition (use as is under a deviation, due date) with an e-signature', async ({
	page
}) => {
	await signInPage(page, app.url, PEOPLE.quality.email, PEOPLE.quality.password);
	await expect(page).toHaveURL(`${app.url}/review`);
	const item = page.locator(`[data-lot-code="${lot.code}"]`);
	await expect(item).toContainText(HOLD_TEXT);
	await expect(item).toContainText('On hold under 1 h');
	await expect(item).toContainText(`${SUPPLIER} · ${PART.number} · PO PO-2026-0912 · ${QUANTITY} units`);
	await shot(page, 'quality-review-queue');

	await item.getByRole('link', { name: lot.code }).click();
	await expect(page.getByRole('heading', { name: `Lot ${lot.code}`, exact: true })).toBeVisible();
	await expect(page.getByRole('heading', { name: 'Plots' })).toBeVisible();
	await expect(page.getByRole('region', { name: 'Plots' }).locator('svg')).toHaveCount(2);
	await expect(page.getByText(HOLD_TEXT).first()).toBeVisible();
	// Nothing is chosen for the manager; the disposition that asks something of the supplier needs a due date.
	await expect(page.getByRole('radio', { checked: true })).toHaveCount(0);
	await page.getByLabel('Use as is under a deviation').check();
	await page.getByLabel('Supplier to act by').fill(DUE_DATE);
	await page
		.getByLabel(/^Reason/)
		.fill(
			'About 27–29 % SOC on the generic curve, ≤ 30 % not shown: the units stay in stores and are not shipped onward by air; ' +
				'supplier asked for its rested OCV table and told to ship at ≤ 30 % SOC.'
		);
	await page.getByLabel('Your password (signature)').fill(PEOPLE.quality.password);
	await shot(page, 'quality-review-decision');
	await page.getByRole('button', { name: 'Sign disposition and notify supplier' }).click();
	await expect(page.getByTestId('decision-message')).toContainText('use as is under a deviation; the lot is now accepted');
	await expect(page.getByText('This lot is accepted; only a lot on hold can be released or rejected here.')).toBeVisible();
	await expect(page.getByRole('button', { name: 'Sign disposition and notify supplier' })).toHaveCount(0);
	await shot(page, 'quality-released');

	await page.getByRole('link', { name: 'Lot page' }).click();
	await expect(page.locator('h1 + [data-status]')).toHaveText('Accepted');
	const panel = page.getByRole('region', { name: 'Disposition and paper trail' });
	await expect(panel).toContainText('e-signed');
	await expect(panel).toContainText(PEOPLE.quality.name);
	await expect(panel.getByTestId('decision-disposition')).toContainText(`Use as is under a deviation · supplier to act by ${DUE_DATE}`);
	await shot(page, 'quality-lot-accepted');
});

test('6. the supplier gets one notice, after the decision; signs in by e-mailed link, reads it and the report, acknowledges and replies', async ({
	page
}) => {
	// Exactly one notice reaches the supplier's contacts by mail (from the local SMTP peer), after
	// quality's decision, the report attached; the engine's hold itself sent nothing.
	const decisionMail = await newestMail('supplier@voltaria-cells.example', (s) =>
		s.startsWith(`Quality decision: lot ${lot.code} ACCEPTED (use as is under a deviation)`)
	);
	expect(decisionMail.text).toContain(HOLD_TEXT);
	expect(decisionMail.text).toContain(`by ${DUE_DATE}.`);
	expect(decisionMail.attachments.map((a) => a.contentType)).toContain('application/pdf');
	// The mail peer keeps earlier runs' messages (same lot codes): count this run's, for this PO.
	const toSupplier = (await readMail()).filter(
		(m) =>
			m.envelope.to.includes('supplier@voltaria-cells.example') &&
			m.subject.includes(lot.code) &&
			m.subject.includes('PO PO-2026-0912') &&
			Number(m.id.split('-')[0]) >= startedAt
	);
	expect(toSupplier.map((m) => m.subject)).toEqual([decisionMail.subject]);

	await signInSupplierByLink(page, app.url, SUPPLIER_USER);
	await expect(page.getByRole('heading', { name: 'Your lots and notices' })).toBeVisible();
	// The seeded scenario leaves other notices open too; this lot adds its one.
	const openHeading = page.getByRole('heading', { name: /^Notices to acknowledge \(\d+\)$/ });
	const openCount = Number(/\((\d+)\)/.exec((await openHeading.textContent())!)![1]);
	const ours = page.getByRole('listitem').filter({ hasText: `lot ${lot.code}` });
	await expect(ours).toHaveCount(1);
	await expect(ours.filter({ hasText: 'Quality decision' })).toContainText('ACCEPTED');
	const lotRow = page.getByRole('row').filter({ hasText: lot.code });
	await expect(lotRow).toContainText('Accepted');
	await shot(page, 'supplier-portal-home');

	await ours.getByRole('link', { name: 'Read and acknowledge' }).click();
	await expect(page.getByRole('heading', { name: `Lot ${lot.code}`, exact: true })).toBeVisible();
	const notices = page.getByTestId('portal-notice');
	await expect(notices).toHaveCount(1);
	const accept = notices.filter({ hasText: 'Quality decision' });
	await expect(accept).toContainText('After review by our quality team the lot is used as is under a deviation.');
	await expect(accept).toContainText(HOLD_TEXT);
	await expect(accept).toContainText('told to ship at ≤ 30 % SOC');
	await expect(accept).toContainText(`Send a corrective-action report (for example an 8D) so the finding does not recur by ${DUE_DATE}.`);
	await expect(accept).not.toContainText('No action');
	await expect(accept).not.toContainText('from memory'); // a source marker belongs in code, not in the supplier's notice
	await shot(page, 'supplier-portal-lot');

	// The report opens in a new tab; its answer is a PDF that names the lot.
	const reportAnswer = page.context().waitForEvent('response', (r) => r.url().includes(`/api/v1/lots/${lot.id}/report.pdf`));
	await page.getByRole('link', { name: 'View the inspection report (PDF)' }).click();
	const answer = await reportAnswer;
	expect(answer.status()).toBe(200);
	expect(answer.headers()['content-type']).toBe('application/pdf');
	const bytes = await (await page.request.get(answer.url())).body();
	const file = resolve(artefacts, 'report.pdf');
	writeFileSync(file, bytes);
	const text = execFileSync('pdftotext', ['-layout', file, '-']).toString();
	expect(text).toContain(lot.code);
	expect(text).toContain(PART.number);
	expect(text).toMatch(/accept/i);
	execFileSync('pdftoppm', ['-png', '-r', '60', file, resolve(artefacts, 'report')]);
	for (const tab of page.context().pages()) if (tab !== page) await tab.close();

	await accept.getByRole('button', { name: 'Acknowledge this notice' }).click();
	await expect(accept.getByText(/✓ Acknowledged/)).toBeVisible();
	await accept
		.getByLabel(/^Reply to/)
		.fill('Noted: from the next shipment on we set the SOC to 30 % before air freight. Our charge record is attached.');
	await accept.getByLabel(/^Document/).setInputFiles({
		name: 'charge-record-vc42j.pdf',
		mimeType: 'application/pdf',
		buffer: await pdf('Charge record', `${PART.number}, shipped at 28 % SOC, corrected procedure`)
	});
	await accept.getByRole('button', { name: 'Send reply' }).click();
	await expect(accept.getByText('Reply sent.')).toBeVisible();
	await expect(accept.getByRole('link', { name: 'charge-record-vc42j.pdf' })).toBeVisible();
	await shot(page, 'supplier-acknowledged');

	await page.getByRole('link', { name: 'Your lots' }).click();
	await expect(page.getByRole('heading', { name: `Notices to acknowledge (${openCount - 1})` })).toBeVisible();
	await expect(ours).toHaveCount(0);
	await expect(lotRow.getByRole('cell').last()).toHaveText('—'); // no open notice left for this lot
	await shot(page, 'supplier-portal-done');
});

test('7. the buyer sees the acknowledgements and the reply on the lot page', async ({ page }) => {
	await signInPage(page, app.url, PEOPLE.buyer.email, PEOPLE.buyer.password);
	await page.getByRole('table', { name: 'Lots' }).getByRole('link', { name: lot.code }).click();
	await expect(page.locator('h1 + [data-status]')).toHaveText('Accepted');
	const panel = page.getByRole('region', { name: 'Disposition and paper trail' });
	await expect(panel).toContainText('Quality decision');
	await expect(panel.getByText(/^✓ Acknowledged \d{4}-\d{2}-\d{2} \d{2}:\d{2}:\d{2} UTC by Mira Okonkwo \(Supplier\)$/)).toHaveCount(1); // src/lib/people.ts: name and role
	await expect(panel).toContainText('from the next shipment on we set the SOC to 30 % before air freight');
	await expect(panel.getByRole('link', { name: 'charge-record-vc42j.pdf' })).toBeVisible();
	await shot(page, 'buyer-lot-acknowledged');
});
