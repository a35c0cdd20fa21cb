import { expect, test, type Locator } from '@playwright/test';
import { signIn, tableLoaded } from './helpers';

async function references(table: Locator): Promise<string[]> {
	return table.locator('tbody tr td:first-child').allInnerTexts();
}

test.beforeEach(async ({ page }) => {
	await signIn(page, 'supervisor');
	await page.goto('/cases');
});

test('search filters the table', async ({ page }) => {
	const table = await tableLoaded(page, 'Cases');
	await expect(table.getByRole('cell', { name: 'QCEU-2026-0142' })).toBeVisible();

	await page.getByLabel('Search title or reference').fill('harbour');
	await expect(table.locator('tbody tr')).toHaveCount(1);
	await expect(table.getByRole('cell', { name: 'OCA-1962-0033' })).toBeVisible();

	await page.getByLabel('Search title or reference').fill('no-such-case-anywhere');
	await expect(table.getByText('No cases match these filters.')).toBeVisible();
});

test('a header click sorts, a second click reverses', async ({ page }) => {
	const table = await tableLoaded(page, 'Cases');
	const header = table.getByRole('columnheader', { name: 'Reference' });
	await expect(header).toHaveAttribute('aria-sort', 'none');

	await header.getByRole('button').click();
	await expect(header).toHaveAttribute('aria-sort', 'ascending');
	await tableLoaded(page, 'Cases');
	const ascending = await references(table);
	expect(ascending.length).toBeGreaterThan(1);
	expect(ascending).toEqual([...ascending].sort());

	await header.getByRole('button').click();
	await expect(header).toHaveAttribute('aria-sort', 'descending');
	await expect.poll(() => references(table)).toEqual([...ascending].reverse());
});

test('the status filter narrows the list', async ({ page }) => {
	const table = await tableLoaded(page, 'Cases');
	await page.getByLabel('Status').selectOption('released');
	await expect(table.locator('tbody tr')).toHaveCount(1);
	await expect(table.getByRole('cell', { name: 'OCA-1962-0033' })).toBeVisible();
});
