/**
 * The administrator's webhook page (register, the secret shown once, the delivery log), the serial
 * trace page and the API reference in Chromium. Screenshots: tests/artifacts/screens/integrations.
 * The app runs with NODE_ENV=test so the receiver may be on 127.0.0.1.
 */
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { expect, test } from '@playwright/test';
import { startApp, type RunningApp } from '../helpers/app';
import { signInPage, tokenFor } from '../helpers/auth';
import { freshDatabase } from '../helpers/db';
import { screens } from '../helpers/screens';
import { call, createLot, type Caller } from '../integration/readings-fixtures';

let app: RunningApp;
let db: { url: string; drop: () => Promise<void> };
let buyer: Caller, inspector: Caller;
let receiver: Server;
let receiverUrl: string;
const shot = screens('integrations');

test.beforeAll(async () => {
	db = await freshDatabase('e2e_integrations', { demo: false });
	app = await startApp({ databaseUrl: db.url, env: { NODE_ENV: 'test' } });
	buyer = { base: app.url, token: await tokenFor(db.url, 'buyer@kestrel-mobility.example') };
	inspector = { base: app.url, token: await tokenFor(db.url, 'inspector@kestrel-mobility.example') };
	receiver = createServer((req, res) => req.resume().on('end', () => res.writeHead(204).end()));
	await new Promise<void>((r) => receiver.listen(0, '127.0.0.1', r));
	receiverUrl = `http://127.0.0.1:${(receiver.address() as AddressInfo).port}/erp-events`;
});

test.afterAll(async () => {
	receiver?.close();
	await app?.stop();
	await db?.drop();
});

test('an administrator registers a webhook and sees its deliveries', async ({ page }) => {
	await signInPage(page, app.url, 'admin@kestrel-mobility.example');
	await page.goto(`${app.url}/admin/webhooks`);
	await page.getByLabel('Address (https://…)').fill(receiverUrl);
	await page.getByLabel('lot.registered').check();
	await page.getByRole('button', { name: 'Register' }).click();
	await expect(page.getByTestId('webhook-secret')).toContainText('whsec_');
	await shot(page, 'webhook-registered');

	await createLot(buyer, { partNumber: 'VC-21700-50G', quantity: 100, declaredSoc: 0.3 });
	// The log shows the delivery once the worker has sent it (the page reads the state on each load).
	await expect(async () => {
		await page.reload();
		await expect(page.getByText('● Delivered')).toBeVisible({ timeout: 500 });
	}).toPass({ timeout: 30_000 });
	await expect(page.getByRole('cell', { name: '204' })).toBeVisible();
	await shot(page, 'webhook-delivery-log');
});

test('the serial trace lists a unit measured in two lots', async ({ page }) => {
	const serial = 'KM-TRACE-0007';
	for (const ocv of [3.61, 3.6]) {
		const lot = await createLot(buyer, { partNumber: 'VC-21700-50G', quantity: 100, declaredSoc: 0.3 });
		expect(
			(await call(inspector, `/api/v1/lots/${lot.id}/readings`, { body: { readings: [{ serial, ocv_v: ocv, temperature_c: 23 }] } })).status
		).toBe(201);
	}
	await signInPage(page, app.url, 'quality@kestrel-mobility.example');
	await page.goto(`${app.url}/lots`);
	await page.getByRole('link', { name: 'Find a serial number' }).click();
	await page.getByLabel('Serial number').fill(serial);
	await page.getByRole('button', { name: 'Find' }).click();
	await expect(page.getByTestId('trace-results').locator('tbody tr')).toHaveCount(2);
	await shot(page, 'serial-trace');
});

test('the API reference renders the OpenAPI document', async ({ page }) => {
	await signInPage(page, app.url, 'admin@kestrel-mobility.example');
	await page.goto(`${app.url}/api-reference`);
	await expect(page.getByRole('heading', { level: 2, name: 'Webhooks', exact: true })).toBeVisible();
	await expect(page.getByText('/api/v1/readings', { exact: true })).toBeVisible();
	await shot(page, 'api-reference');
});
