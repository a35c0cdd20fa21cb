import { describe, expect, it } from 'vitest';
import { spectrumSource } from './spectrum-source';

// Plain geometry of our own routes (common practice, no source): a centred crop and the region as given.
describe('spectrumSource', () => {
	it('takes a centred square from the original when no region is picked', () => {
		const source = spectrumSource({ id: 7, width: 960, height: 640 }, null, null, 256);
		expect(source?.rect).toEqual({ x: 352, y: 192, width: 256, height: 256 });
		expect(source?.src).toBe('/api/items/7/region?x=352&y=192&width=256&height=256');
	});

	it('uses the picked region unchanged', () => {
		const region = { x: 10, y: 20, width: 300, height: 200 };
		expect(spectrumSource({ id: 3, width: 4000, height: 3000 }, region)?.rect).toEqual(region);
	});

	it('follows the zoom view: the centre of the pixels on screen', () => {
		const visible = { x: 100, y: 40, width: 400, height: 300 };
		expect(spectrumSource({ id: 7, width: 960, height: 640 }, null, visible, 256)?.rect).toEqual({ x: 172, y: 62, width: 256, height: 256 });
	});

	it('zoomed far in, the square reaches past the screen to 128 px, inside the image', () => {
		const visible = { x: 900, y: 10, width: 60, height: 40 };
		expect(spectrumSource({ id: 7, width: 960, height: 640 }, null, visible, 256)?.rect).toEqual({ x: 832, y: 0, width: 128, height: 128 });
	});

	it('shrinks the square to a small image and gives up on an empty one', () => {
		expect(spectrumSource({ id: 1, width: 100, height: 50 }, null, null, 256)?.rect).toEqual({ x: 25, y: 0, width: 50, height: 50 });
		expect(spectrumSource({ id: 1, width: 0, height: 0 }, null)).toBeNull();
	});
});
