/** Shared steps for the end-to-end tests: the demo accounts and signing in as one of them. */
import { mkdirSync } from 'node:fs';
import { expect, type Page } from '@playwright/test';
import type { Role } from '../../src/lib/roles';

/** The seeded demo accounts (src/lib/server/demo/scenario.ts). */
export const DEMO: Record<Role, { email: string; password: string; name: string }> = {
	admin: { email: 'admin@stillpoint.example', password: 'demo-admin-pass', name: 'Avery Quist (admin)' },
	technician: { email: 'tech@stillpoint.example', password: 'demo-tech-pass', name: 'Tamsin Vell (technician)' },
	supervisor: { email: 'supervisor@stillpoint.example', password: 'demo-super-pass', name: 'Orrin Blaydes (supervisor)' },
	client: { email: 'client@stillpoint.example', password: 'demo-client-pass', name: 'Pell Marrow (client)' }
};

/** The root layout marks <html> once Svelte has hydrated; clicking earlier can miss handlers. */
export async function waitForHydration(page: Page): Promise<void> {
	await page.locator('html[data-hydrated]').waitFor({ state: 'attached' });
}

/**
 * Sign in through the real form and land on home. Pass `javascript: false` for a context
 * created with JavaScript disabled, where the page never hydrates.
 */
export async function signIn(page: Page, role: Role, options: { javascript?: boolean } = {}): Promise<void> {
	await page.goto('/signin');
	if (options.javascript !== false) await waitForHydration(page);
	await page.getByLabel('E-mail').fill(DEMO[role].email);
	await page.getByLabel('Password').fill(DEMO[role].password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL((url) => url.pathname === '/');
	if (options.javascript !== false) await waitForHydration(page);
}

/** Wait until a client-fetched table has finished loading (it sets aria-busy while fetching). */
export async function tableLoaded(page: Page, name: string) {
	const table = page.getByRole('table', { name, exact: true });
	await expect(table).toHaveAttribute('aria-busy', 'false');
	return table;
}

/**
 * Zoom and pan the before/after viewer with the mouse in its first pane, then check that the
 * original and the result carry one and the same transform (pixel-aligned at the same scale).
 */
export async function expectComparePanesAligned(page: Page): Promise<void> {
	const panes = page.getByTestId('compare-pane');
	await expect(panes).toHaveCount(2);
	await panes.first().scrollIntoViewIfNeeded();
	const pane = (await panes.first().boundingBox())!;
	const centre = { x: pane.x + pane.width / 2, y: pane.y + pane.height / 2 };
	await page.mouse.move(centre.x, centre.y);
	await page.mouse.wheel(0, -300);
	await expect(page.getByTestId('compare-zoom')).not.toHaveText('100 %');
	await page.mouse.down();
	await page.mouse.move(centre.x - 50, centre.y + 30, { steps: 4 });
	await page.mouse.up();
	const [left, right] = await Promise.all(
		[page.getByTestId('original-preview'), page.getByTestId('result-preview')].map((image) => image.evaluate((img: HTMLElement) => img.style.transform))
	);
	expect(left).toMatch(/translate\(.+\) scale\(.+\)/);
	expect(right).toBe(left);
}

/**
 * Screenshots at the two screen sizes the workbench is designed for, kept as CI artefacts in
 * tests/artifacts/ (ignored by git): `<name>-<w>x<h>.png` (the first screen) and `…-full.png`.
 */
export async function screenshotAtDesignSizes(page: Page, name: string): Promise<void> {
	mkdirSync('tests/artifacts', { recursive: true });
	for (const [width, height] of [
		[1366, 768],
		[1920, 1080]
	] as const) {
		await page.setViewportSize({ width, height });
		await page.evaluate(() => window.scrollTo(0, 0));
		await page.screenshot({ path: `tests/artifacts/${name}-${width}x${height}.png` });
		await page.screenshot({ path: `tests/artifacts/${name}-${width}x${height}-full.png`, fullPage: true });
	}
}
