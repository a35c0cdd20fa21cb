import { expect, test } from '@playwright/test';
import { DEMO, signIn, tableLoaded, waitForHydration } from './helpers';

test.beforeEach(async ({ page }) => {
	await signIn(page, 'admin');
	await page.goto('/admin/users');
	await waitForHydration(page);
});

test('an administrator creates a user, who appears in the table', async ({ page }) => {
	const email = `e2e-${Date.now()}@stillpoint.example`;
	const form = page.getByRole('region', { name: 'Add a user' });
	await form.getByLabel('Name').fill('Ines Kettle (e2e)');
	await form.getByLabel('E-mail').fill(email);
	await form.getByLabel('Role').selectOption('supervisor');
	await form.getByLabel('Initial password').fill('a-long-enough-password');
	await form.getByRole('button', { name: 'Create user' }).click();

	await expect(form.getByRole('status')).toContainText('Account created');
	const table = await tableLoaded(page, 'Users');
	await expect(table.getByRole('cell', { name: email })).toBeVisible();
});

test('an e-mail already in use is refused on that field', async ({ page }) => {
	const form = page.getByRole('region', { name: 'Add a user' });
	await form.getByLabel('Name').fill('Someone Else');
	await form.getByLabel('E-mail').fill(DEMO.client.email);
	await form.getByLabel('Initial password').fill('a-long-enough-password');
	await form.getByRole('button', { name: 'Create user' }).click();
	await expect(form.getByText('A user with this e-mail already exists')).toBeVisible();
});

test('the last administrator cannot be demoted', async ({ page }) => {
	const table = await tableLoaded(page, 'Users');
	const row = table.getByRole('row').filter({ hasText: DEMO.admin.email });
	await row.getByLabel(`Role for ${DEMO.admin.name}`).selectOption('technician');
	await row.getByRole('button', { name: 'Set' }).click();
	await expect(row.getByRole('alert')).toHaveText('The last administrator cannot lose the admin role');
});

test('an administrator adds a member to a case', async ({ page }) => {
	// A case of its own, and a staff member (who sees every case anyway), so no other test's
	// view of the seeded cases changes.
	const reference = `E2E-M-${Date.now()}`;
	const created = await page.request.post('/api/cases', {
		data: { title: 'Membership check', reference, kind: 'forensic' }
	});
	expect(created.status()).toBe(201);
	const { case: record } = (await created.json()) as { case: { id: number } };

	await page.goto(`/cases/${record.id}`);
	await expect(page.getByTestId('case-reference')).toHaveText(reference);
	await waitForHydration(page);

	const members = page.getByRole('region', { name: 'Members' });
	await members.getByRole('button', { name: 'Add' }).click();
	await expect(members.getByRole('alert')).toHaveText('Choose a user');

	const picker = members.getByLabel('Add member');
	await picker.selectOption({ label: `${DEMO.supervisor.name} — Supervisor` });
	await members.getByRole('button', { name: 'Add' }).click();
	await expect(members.getByRole('status')).toHaveText('Member added.');
	await expect(members.getByRole('listitem').filter({ hasText: DEMO.supervisor.name })).toBeVisible();
	await expect(picker.locator('option', { hasText: DEMO.supervisor.name })).toHaveCount(0);
});
