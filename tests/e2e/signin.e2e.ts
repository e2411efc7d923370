/**
 * Each role signs in through the real pages in Chromium and lands on its own home: staff with a
 * password, the supplier with the link read from the local SMTP peer. Assertions are on the URL
 * and the header's role label (the home pages themselves belong to other screens' tests).
 */
import { expect, test } from '@playwright/test';
import { startApp, type RunningApp } from '../helpers/app';
import { freshDatabase } from '../helpers/db';
import { screens } from '../helpers/screens';
import { signInPage, signInSupplierByLink } from '../helpers/auth';

let app: RunningApp;
let db: { url: string; drop: () => Promise<void> };
const shot = screens('signin');

test.beforeAll(async () => {
	db = await freshDatabase('e2e_signin');
	app = await startApp({ databaseUrl: db.url });
});

test.afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

const STAFF = [
	{ email: 'buyer@kestrel-mobility.example', home: '/lots', label: 'Buyer' },
	{ email: 'inspector@kestrel-mobility.example', home: '/inspect', label: 'Receiving inspector' },
	{ email: 'quality@kestrel-mobility.example', home: '/review', label: 'Quality manager' },
	{ email: 'admin@kestrel-mobility.example', home: '/admin/users', label: 'Administrator' }
];

test('the sign-in page offers both paths and explains a wrong password', async ({ page }) => {
	await page.goto(`${app.url}/signin`);
	await expect(page.getByRole('heading', { name: 'Staff sign-in' })).toBeVisible();
	await expect(page.getByRole('heading', { name: 'Supplier portal: get a sign-in link' })).toBeVisible();
	await shot(page, 'signin-page');
	await page.getByLabel('Work e-mail').fill('buyer@kestrel-mobility.example');
	await page.getByLabel('Password').fill('not-my-password');
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByRole('alert')).toHaveText('That e-mail address and password do not match.');
	await expect(page).toHaveURL(/\/signin/);
	await shot(page, 'wrong-password');
});

for (const person of STAFF) {
	test(`${person.label} signs in with a password and lands on ${person.home}`, async ({ page }) => {
		await signInPage(page, app.url, person.email);
		await expect(page).toHaveURL(`${app.url}${person.home}`);
		await expect(page.getByRole('banner').getByText(person.label, { exact: true })).toBeVisible();
		await shot(page, `home-${person.label.toLowerCase().replace(/\W+/g, '-')}`);
	});
}

test('a deep link survives the sign-in (redirectTo)', async ({ page }) => {
	await page.goto(`${app.url}/admin/tokens`);
	await expect(page).toHaveURL(/\/signin\?redirectTo=%2Fadmin%2Ftokens/);
	await page.getByLabel('Work e-mail').fill('admin@kestrel-mobility.example');
	await page.getByLabel('Password').fill('restvolt-demo-2026');
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL(`${app.url}/admin/tokens`);
	await expect(page.getByText('No API tokens yet.')).toBeVisible();
	// Create one: shown once, then listed by its prefix, then revoked.
	await page.getByLabel('Acts as').selectOption({ label: 'inspector@kestrel-mobility.example · Receiving inspector' });
	await page.getByLabel('What it is for').fill('bench meter bridge');
	await page.getByRole('button', { name: 'Create token' }).click();
	const token = (await page.getByTestId('new-token').textContent())!.trim();
	expect(token).toMatch(/^rv_[\w-]{43}$/);
	const me = await fetch(`${app.url}/api/v1/me`, { headers: { authorization: `Bearer ${token}` } });
	expect((await me.json()).role).toBe('inspector');
	await expect(page.getByRole('cell', { name: /bench meter bridge/ })).toBeVisible();
	await shot(page, 'admin-token-created');
	await page.getByRole('button', { name: 'Revoke' }).click();
	await expect(page.getByText(/○ Revoked/)).toBeVisible();
	expect((await fetch(`${app.url}/api/v1/me`, { headers: { authorization: `Bearer ${token}` } })).status).toBe(401);
	await shot(page, 'admin-token-revoked');
	await page.goto(`${app.url}/admin/organisations`);
	await expect(page.getByRole('heading', { name: 'Organisations' })).toBeVisible();
	await shot(page, 'admin-organisations');
});

test('the supplier signs in with the e-mailed link, lands on the portal and can sign out', async ({ page }) => {
	await signInSupplierByLink(page, app.url, 'supplier@plumbridge.example');
	await expect(page).toHaveURL(`${app.url}/portal`);
	await expect(page.getByRole('banner').getByText('Supplier', { exact: true })).toBeVisible();
	await shot(page, 'home-supplier');
	await page.getByRole('button', { name: 'Sign out' }).click();
	await expect(page).toHaveURL(`${app.url}/signin?signed-out`);
	await expect(page.getByText('You are signed out.')).toBeVisible();
	await page.goto(`${app.url}/portal`);
	await expect(page).toHaveURL(/\/signin\?redirectTo=%2Fportal/);
});

test('the link-sent page reads calmly', async ({ page }) => {
	await page.goto(`${app.url}/signin`);
	await page.getByLabel('E-mail', { exact: true }).fill('someone@example.test');
	await page.getByRole('button', { name: 'E-mail me a sign-in link' }).click();
	await expect(page.getByRole('heading', { name: 'Check your e-mail' })).toBeVisible();
	await shot(page, 'link-sent');
});
