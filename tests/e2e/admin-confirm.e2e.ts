/**
 * Admin changes that alter what a person can do ask first and are recorded: deactivation and a role
 * change each need a second, explicit click; "Keep" changes nothing; the confirmed change is audited.
 */
import { expect, test } from '@playwright/test';
import { startApp, type RunningApp } from '../helpers/app';
import { freshDatabase, withClient } from '../helpers/db';
import { screens } from '../helpers/screens';
import { signInPage } from '../helpers/auth';

let app: RunningApp;
let db: { url: string; drop: () => Promise<void> };
const shot = screens('admin');
const TARGET = 'inspector@kestrel-mobility.example';

test.beforeAll(async () => {
	db = await freshDatabase('e2e_admin_confirm', { demo: false });
	app = await startApp({ databaseUrl: db.url });
});

test.afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

const audited = (action: string) =>
	withClient(db.url, async (c) => {
		const { rows } = await c.query(
			`select count(*)::int as n from audit_events a join "user" u on u.id = a.entity_id where a.action = $1 and u.email = $2`,
			[action, TARGET]
		);
		return rows[0].n as number;
	});
const isActive = () =>
	withClient(db.url, async (c) => (await c.query('select active from "user" where email = $1', [TARGET])).rows[0].active as boolean);

test('deactivation asks first, "Keep active" changes nothing, and the confirmed change is audited', async ({ page }) => {
	await signInPage(page, app.url, 'admin@kestrel-mobility.example');
	await page.goto(`${app.url}/admin/users`);
	const row = page.getByRole('row').filter({ hasText: TARGET });
	await row.getByRole('button', { name: 'Deactivate…' }).click();
	await expect(row.getByRole('alert')).toContainText(`Deactivate ${TARGET}?`);
	await shot(page, 'deactivate-confirm');
	await row.getByRole('button', { name: 'Keep active' }).click();
	await expect(row.getByRole('button', { name: 'Deactivate…' })).toBeVisible();
	expect(await isActive()).toBe(true);

	await row.getByRole('button', { name: 'Deactivate…' }).click();
	await row.getByRole('button', { name: 'Yes, deactivate' }).click();
	await expect(row.getByText('○ Deactivated')).toBeVisible();
	expect(await isActive()).toBe(false);
	expect(await audited('user.deactivated')).toBe(1);
});

test('a role change asks first and is audited', async ({ page }) => {
	await signInPage(page, app.url, 'admin@kestrel-mobility.example');
	await page.goto(`${app.url}/admin/users`);
	const row = page.getByRole('row').filter({ hasText: TARGET });
	await row.getByLabel(`Role of ${TARGET}`).selectOption({ label: 'Buyer' });
	await row.getByRole('button', { name: 'Change…' }).click();
	await expect(row.getByRole('alert')).toContainText(`Change the role of ${TARGET}?`);
	await shot(page, 'role-confirm');
	await row.getByRole('button', { name: 'Yes, change the role' }).click();
	await expect(row.getByRole('button', { name: 'Change…' })).toBeVisible();
	await expect
		.poll(() => withClient(db.url, async (c) => (await c.query('select role from "user" where email = $1', [TARGET])).rows[0].role))
		.toBe('buyer');
	expect(await audited('user.role_changed')).toBe(1);
});
