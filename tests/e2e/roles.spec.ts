import { expect, test } from '@playwright/test';
import { DEMO, signIn, tableLoaded, waitForHydration } from './helpers';

test.describe('each demo role sees its own home', () => {
	test('technician: my open cases', async ({ page }) => {
		await signIn(page, 'technician');
		await expect(page.getByRole('heading', { name: 'My open cases' })).toBeVisible();
		const table = await tableLoaded(page, 'My open cases');
		await expect(table.getByRole('cell', { name: 'QCEU-2026-0142' })).toBeVisible();
		// Opened by the administrator and not shared with the technician: not "mine".
		await expect(table.getByRole('cell', { name: 'OCA-1971-0108' })).toHaveCount(0);
		await expect(page.getByTestId('signed-in-user')).toContainText(DEMO.technician.name);
	});

	test('supervisor: waiting for review', async ({ page }) => {
		await signIn(page, 'supervisor');
		const table = await tableLoaded(page, 'Waiting for review');
		await expect(table.getByRole('cell', { name: 'QCEU-2026-0157' })).toBeVisible();
		await expect(table.locator('tbody tr')).toHaveCount(1);
		await expect(page.getByRole('link', { name: 'New case' })).toHaveCount(0);
	});

	test('client: released to me, and nothing else', async ({ page }) => {
		await signIn(page, 'client');
		const table = await tableLoaded(page, 'Released to me');
		await expect(table.getByRole('cell', { name: 'OCA-1962-0033' })).toBeVisible();
		await expect(table.locator('tbody tr')).toHaveCount(1);

		// The full case list holds only the client's two cases.
		await page.getByRole('link', { name: 'Cases', exact: true }).click();
		const all = await tableLoaded(page, 'Cases');
		await expect(all.locator('tbody tr')).toHaveCount(2);
		await expect(all.getByRole('cell', { name: 'OCA-1962-0033' })).toBeVisible();
		await expect(all.getByRole('cell', { name: 'QCEU-2026-0142' })).toBeVisible();
	});

	test('admin: users and recent cases', async ({ page }) => {
		await signIn(page, 'admin');
		const users = await tableLoaded(page, 'Users');
		await expect(users.getByRole('cell', { name: DEMO.client.email })).toBeVisible();
		await tableLoaded(page, 'Recent cases');
		await expect(page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Users' })).toBeVisible();
	});
});

test.describe('a page outside the role is refused', () => {
	for (const [role, path] of [
		['client', '/cases/new'],
		['supervisor', '/cases/new'],
		['technician', '/admin/users'],
		['client', '/admin/users']
	] as const) {
		test(`${role} → ${path} is 403`, async ({ page }) => {
			await signIn(page, role);
			const response = await page.goto(path);
			expect(response?.status()).toBe(403);
			await expect(page.getByText('Your role does not allow this')).toBeVisible();
		});
	}

	test('a client cannot open a case it is not a member of', async ({ page }) => {
		await signIn(page, 'client');
		await page.goto('/cases');
		const table = await tableLoaded(page, 'Cases');
		await expect(table.getByRole('cell', { name: 'OCA-1971-0108' })).toHaveCount(0);
	});
});

test('anonymous visitors are sent to sign in, then back where they were going', async ({ page }) => {
	await page.goto('/cases');
	await expect(page).toHaveURL(/\/signin\?redirectTo=%2Fcases$/);
	await waitForHydration(page);
	await page.getByLabel('E-mail').fill(DEMO.supervisor.email);
	await page.getByLabel('Password').fill(DEMO.supervisor.password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL((url) => url.pathname === '/cases');
	await expect(page.getByRole('heading', { name: 'Cases', exact: true })).toBeVisible();
});

test('a wrong password gets the one generic message', async ({ page }) => {
	await page.goto('/signin');
	await waitForHydration(page);
	// An address no demo account uses, so the failure counter never blocks a demo sign-in.
	await page.getByLabel('E-mail').fill('nobody@stillpoint.example');
	await page.getByLabel('Password').fill('not-the-password');
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByRole('alert')).toContainText('E-mail or password not accepted');
});

test('signing out returns to the sign-in page, and a copy of the old cookie no longer works', async ({ page, context }) => {
	await signIn(page, 'technician');
	const copied = await context.cookies();
	expect((await page.request.get('/api/cases')).status()).toBe(200);
	await page.getByRole('button', { name: 'Sign out' }).click();
	await page.goto('/');
	await expect(page).toHaveURL(/\/signin/);
	// Someone who copied the session cookie before sign-out replays it.
	await context.addCookies(copied);
	expect((await page.request.get('/api/cases')).status()).toBe(401);
});
