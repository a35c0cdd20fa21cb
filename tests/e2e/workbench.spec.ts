/**
 * Issue 4's browser path and the first workbench parts of issue 5: a technician uploads a blurred
 * photograph with a per-file progress bar, opens it, watches the kernel panel follow the form,
 * queues a straight-motion Wiener run, follows its progress to the end and sees the result.
 */
import { expect, test, type Page } from '@playwright/test';
import sharp from 'sharp';
import { buildKernel } from '../../src/lib/imaging/kernels/build';
import { expectComparePanesAligned, screenshotAtDesignSizes, signIn, tableLoaded, waitForHydration } from './helpers';

/** An invented harbour sign, blurred by the engine's own 9-pixel motion at 30°; unique text so a rerun is never a duplicate. */
async function blurredSign(): Promise<Buffer> {
	const motion = buildKernel({ kind: 'line', length: 9, angleDeg: 30 });
	const stamp = `${Date.now()}`;
	const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="360" height="220">
		<rect width="360" height="220" fill="#c9c4b8"/>
		<rect x="30" y="30" width="300" height="160" rx="8" fill="#1f3a5f"/>
		<text x="180" y="95" font-family="sans-serif" font-size="40" font-weight="bold" fill="#f4f1e8" text-anchor="middle">BERTH 14</text>
		<text x="180" y="140" font-family="sans-serif" font-size="20" fill="#f4f1e8" text-anchor="middle">NO MOORING · 06–22</text>
		<text x="180" y="175" font-family="monospace" font-size="12" fill="#f4f1e8" text-anchor="middle">${stamp}</text>
	</svg>`;
	return sharp(Buffer.from(svg))
		// The line kernel is point-symmetric, so sharp's correlation equals the convolution.
		.convolve({ width: motion.shape[1], height: motion.shape[0], kernel: Array.from(motion.data), scale: 1 })
		.png()
		.toBuffer();
}

async function kernelImage(page: Page): Promise<string> {
	return page.getByTestId('kernel-canvas').evaluate((canvas: HTMLCanvasElement) => canvas.toDataURL());
}

test('upload, queue a straight-motion run, follow it and see the result', async ({ page }) => {
	test.setTimeout(180_000);
	await signIn(page, 'technician');
	await page.goto('/cases');
	const cases = await tableLoaded(page, 'Cases');
	await cases.locator('tr', { hasText: 'QCEU-2026-0142' }).getByRole('link').click();
	await waitForHydration(page);
	await expect(page.getByRole('heading', { name: 'Originals' })).toBeVisible();

	const name = `berth-sign-${Date.now()}.png`;
	await page.getByLabel('Upload originals').setInputFiles({ name, mimeType: 'image/png', buffer: await blurredSign() });
	const upload = page.getByRole('list', { name: 'Uploads' }).getByRole('listitem').filter({ hasText: name });
	await expect(upload.getByRole('progressbar')).toBeVisible();
	await expect(upload.getByRole('progressbar')).toHaveAttribute('aria-valuenow', '100', { timeout: 30_000 });
	await expect(upload).toHaveAttribute('data-upload-state', 'new');
	const originals = page.getByRole('table', { name: 'Originals' });
	await expect(originals.getByRole('link', { name })).toBeVisible();

	await originals.getByRole('link', { name }).click();
	await expect(page.getByRole('heading', { level: 1, name })).toBeVisible();
	await waitForHydration(page);
	await expect(page.getByTestId('zoom-view').getByText('Preparing tiles…')).toBeHidden({ timeout: 20_000 });
	await expect(page.getByTestId('restoration-caution')).toContainText('aid to interpretation');

	await page.getByLabel('Kernel', { exact: true }).selectOption('line');
	await page.getByLabel('Length px').fill('5');
	await expect(page.getByTestId('kernel-size')).toContainText('5×');
	const shortKernel = await kernelImage(page);
	await page.getByLabel('Length px').fill('9');
	await page.getByLabel('Angle °').fill('30');
	await expect.poll(() => kernelImage(page)).not.toBe(shortKernel);
	await expect(page.getByTestId('kernel-size')).not.toContainText('5×5');

	await page.getByLabel('Method').selectOption('wiener');

	// Region preview in the Web Worker: drag a box over the sign, then change a setting and see it refresh.
	const picker = page.getByTestId('region-picker').locator('img');
	await expect(picker).toHaveJSProperty('complete', true);
	// The mouse works in viewport coordinates: bring the picker (below the zoom view) on screen first.
	await picker.scrollIntoViewIfNeeded();
	const box = (await picker.boundingBox())!;
	await page.mouse.move(box.x + box.width * 0.15, box.y + box.height * 0.2);
	await page.mouse.down();
	await page.mouse.move(box.x + box.width * 0.6, box.y + box.height * 0.5, { steps: 5 });
	await page.mouse.move(box.x + box.width * 0.85, box.y + box.height * 0.8, { steps: 5 });
	await page.mouse.up();
	const regionResult = page.getByTestId('region-result');
	await expect(regionResult).toHaveAttribute('data-state', 'ready', { timeout: 20_000 });
	await expect(page.getByTestId('region-status')).toContainText(/\d+×\d+ px in \d+ ms/);
	const firstPreview = Number(await regionResult.getAttribute('data-answered'));
	await page.getByLabel('Length px').fill('10');
	await expect.poll(async () => Number(await regionResult.getAttribute('data-answered'))).toBeGreaterThan(firstPreview);
	await expect(regionResult).toHaveAttribute('data-state', 'ready');
	await page.getByLabel('Length px').fill('9');

	await page.getByRole('button', { name: 'Queue full resolution' }).click();

	const history = page.getByRole('table', { name: 'Run history' });
	const row = history.locator('tbody tr').first();
	await expect(row).toContainText('line L=9 θ=30°');
	// The live bar appears while the worker holds the run (a fast worker may finish first).
	await expect(row.getByRole('progressbar').or(row.locator('[data-status="succeeded"]'))).toBeVisible();
	await expect(row).toHaveAttribute('data-run-status', 'succeeded', { timeout: 120_000 });
	await expect(row.getByRole('progressbar')).toHaveCount(0);

	const result = page.getByTestId('result-preview');
	await expect(result).toBeVisible();
	await expect.poll(() => result.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth), { timeout: 20_000 }).toBeGreaterThan(0);
	await expect(row.locator('[data-digest]')).toHaveAttribute('data-digest', /^[0-9a-f]{64}$/);

	// Before/after viewer: zoom and pan in one pane move both, pixel for pixel.
	await expectComparePanesAligned(page);
	await page.getByRole('button', { name: 'Swipe' }).click();
	await expect(page.getByRole('slider')).toBeVisible();
	await page.getByRole('button', { name: 'Side by side' }).click();
	await page.getByRole('toolbar', { name: 'Comparison' }).getByRole('button', { name: 'Fit' }).click();

	await screenshotAtDesignSizes(page, 'upload-and-run');
});

test('a bad settings value is refused with the field named, and nothing is queued', async ({ page }) => {
	await signIn(page, 'technician');
	await page.goto('/cases');
	const cases = await tableLoaded(page, 'Cases');
	await cases.locator('tr', { hasText: 'QCEU-2026-0142' }).getByRole('link').click();
	await waitForHydration(page);
	// The demo photo the e2e seed registers (scripts/test.sh seeds --with-photo); other tests add
	// originals to this case in parallel, so it is picked by name.
	const demoPhoto = page.getByRole('table', { name: 'Originals' }).getByRole('link', { name: 'fenwick-row-bay-14.png' });
	await expect(demoPhoto).toBeVisible();
	await demoPhoto.click();
	await waitForHydration(page);
	// Counted through the API, not the table, which may still be filling in after hydration.
	const itemId = new URL(page.url()).pathname.split('/').pop();
	const runCount = async () => ((await (await page.request.get(`/api/items/${itemId}/runs`)).json()) as { runs: unknown[] }).runs.length;
	const runsBefore = await runCount();

	await page.getByLabel('Method').selectOption('rltv');
	await page.getByLabel('TV strength').fill('0.5');
	await page.getByRole('button', { name: 'Queue full resolution' }).click();
	await expect(page.getByText('TV strength must be below 0.25')).toBeVisible();
	expect(await runCount()).toBe(runsBefore);
});
