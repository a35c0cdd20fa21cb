import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { buildKernel } from '../../imaging';
import { busiestRegion, enlargedCrop, kernelImage, samePanels } from './report-images';

/** A flat grey picture with one checkerboard patch: the only place with edges. */
async function flatWithPatch(width: number, height: number, patch: { x: number; y: number; side: number }): Promise<Buffer> {
	const pixels = Buffer.alloc(width * height, 128);
	for (let y = patch.y; y < patch.y + patch.side; y++) {
		for (let x = patch.x; x < patch.x + patch.side; x++) pixels[y * width + x] = (x + y) % 2 ? 255 : 0;
	}
	return sharp(pixels, { raw: { width, height, channels: 1 } }).png().toBuffer();
}

describe('report images', () => {
	it('finds the window holding the only edges', async () => {
		const region = await busiestRegion(await flatWithPatch(400, 300, { x: 250, y: 150, side: 40 }));
		expect(region.width).toBe(96);
		// The chosen window covers the whole patch.
		expect(region.x).toBeLessThanOrEqual(250);
		expect(region.y).toBeLessThanOrEqual(150);
		expect(region.x + region.width).toBeGreaterThanOrEqual(290);
		expect(region.y + region.height).toBeGreaterThanOrEqual(190);
	});

	it('gives both panels one size and enlarges a crop by whole pixels', async () => {
		const panels = await samePanels(await flatWithPatch(400, 300, { x: 0, y: 0, side: 8 }), await flatWithPatch(200, 150, { x: 0, y: 0, side: 4 }));
		expect([panels.width, panels.height]).toEqual([400, 300]);
		expect((await sharp(panels.result).metadata()).width).toBe(400);
		const crop = await enlargedCrop(panels.original, { x: 0, y: 0, width: 10, height: 10 });
		expect((await sharp(crop).metadata()).width).toBe(30);
	});

	it('draws the kernel nearest-neighbour, its size as [height, width]', async () => {
		const spec = { kind: 'line', length: 9, angleDeg: 0 } as const;
		const [h, w] = buildKernel(spec).shape;
		const { png, size } = await kernelImage(spec);
		expect(size).toEqual([h, w]);
		const meta = await sharp(png).metadata();
		expect(meta.width! % w).toBe(0);
		expect(meta.width! / w).toBe(meta.height! / h);
	});
});
