import { expect, test } from '@playwright/test';
import { signIn, waitForHydration } from './helpers';

test.describe('new case form', () => {
	test.beforeEach(async ({ page }) => {
		await signIn(page, 'technician');
		await page.getByRole('link', { name: 'New case' }).click();
		await expect(page.getByRole('heading', { name: 'New case' })).toBeVisible();
		await waitForHydration(page);
	});

	test('rejects an empty title with a visible message', async ({ page }) => {
		await page.getByRole('button', { name: 'Open case' }).click();
		await expect(page.getByText('Title needs at least 3 characters')).toBeVisible();
		await expect(page.getByLabel('Title')).toHaveAttribute('aria-invalid', 'true');
		await expect(page).toHaveURL((url) => url.pathname === '/cases/new');
	});

	test('creates a case and lands on its page', async ({ page }) => {
		const reference = `E2E-${Date.now()}`;
		const title = `End-to-end check, defocused plate ${reference}`;
		await page.getByLabel('Title').fill(title);
		await page.getByLabel('Reference').fill(reference.toLowerCase());
		await page.getByLabel('Kind').selectOption('archival');
		await page.getByLabel('Description').fill('Created by the end-to-end tests.');
		await page.getByRole('button', { name: 'Open case' }).click();

		await expect(page).toHaveURL(/\/cases\/\d+$/);
		await expect(page.getByRole('heading', { level: 1 })).toHaveText(title);
		// The schema stores references in upper case.
		await expect(page.getByTestId('case-reference')).toHaveText(reference);
		await expect(page.getByText('Archival')).toBeVisible();
	});

	test('a reference already in use is refused on that field', async ({ page }) => {
		await page.getByLabel('Title').fill('Duplicate of a seeded reference');
		await page.getByLabel('Reference').fill('QCEU-2026-0142');
		await page.getByRole('button', { name: 'Open case' }).click();
		await expect(page.getByText('A case with this reference already exists')).toBeVisible();
		await expect(page.getByLabel('Reference')).toHaveAttribute('aria-invalid', 'true');
	});
});

test.describe('new case form without JavaScript', () => {
	test.use({ javaScriptEnabled: false });

	test('the server rejects an empty title with a visible message', async ({ page }) => {
		await signIn(page, 'technician', { javascript: false });
		await page.goto('/cases/new');
		await page.getByRole('button', { name: 'Open case' }).click();
		await expect(page.getByText('Title needs at least 3 characters')).toBeVisible();
	});
});
