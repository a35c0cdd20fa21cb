import { expect, test } from '@playwright/test';
import { signIn } from './helpers';

test.use({ colorScheme: 'light' });

test('the theme toggle switches the dark class and remembers the choice', async ({ page }) => {
	await signIn(page, 'technician');
	const html = page.locator('html');
	await expect(html).not.toHaveClass(/\bdark\b/);

	await page.getByRole('button', { name: 'Switch to dark theme' }).click();
	await expect(html).toHaveClass(/\bdark\b/);

	await page.reload();
	await expect(html).toHaveClass(/\bdark\b/);
	await page.getByRole('button', { name: 'Switch to light theme' }).click();
	await expect(html).not.toHaveClass(/\bdark\b/);
});
