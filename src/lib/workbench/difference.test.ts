import { describe, expect, it } from 'vitest';
import { DIFFERENCE_GAINS, SIGNED_ZERO, differenceImage, type DifferenceGain } from './difference';

/** RGBA pixels from [r, g, b] triples, alpha 255. */
const rgba = (...pixels: [number, number, number][]) => new Uint8ClampedArray(pixels.flatMap(([r, g, b]) => [r, g, b, 255]));

// The expected values follow from the definition in difference.ts (|a − b| · gain, clipped to 255;
// signed: 128 + (a − b) · gain, clipped to 0–255): common practice, no source.
describe('differenceImage', () => {
	it('is black everywhere for identical pictures, at every gain', () => {
		const picture = rgba([0, 0, 0], [12, 200, 255], [255, 255, 255], [97, 3, 180]);
		for (const gain of DIFFERENCE_GAINS) {
			const { data, maxAbs, differing } = differenceImage(picture, picture.slice(), { gain });
			expect(Array.from(data)).toEqual(Array.from(rgba([0, 0, 0], [0, 0, 0], [0, 0, 0], [0, 0, 0])));
			expect(maxAbs).toBe(0);
			expect(differing).toBe(0);
		}
	});

	it('is mid-grey everywhere for identical pictures in signed mode', () => {
		const picture = rgba([40, 50, 60], [255, 0, 128]);
		const { data } = differenceImage(picture, picture.slice(), { gain: 32, signed: true });
		expect(Array.from(data)).toEqual(Array.from(rgba([SIGNED_ZERO, SIGNED_ZERO, SIGNED_ZERO], [SIGNED_ZERO, SIGNED_ZERO, SIGNED_ZERO])));
	});

	it('multiplies |a − b| by the gain and clips at 255', () => {
		const a = rgba([100, 10, 0]);
		const b = rgba([97, 20, 255]);
		const cases: [DifferenceGain, [number, number, number]][] = [
			[1, [3, 10, 255]],
			[4, [12, 40, 255]],
			[16, [48, 160, 255]],
			[32, [96, 255, 255]]
		];
		for (const [gain, expected] of cases) {
			expect(Array.from(differenceImage(a, b, { gain }).data)).toEqual(Array.from(rgba(expected)));
		}
	});

	it('is symmetric in absolute mode', () => {
		const a = rgba([5, 60, 200], [1, 2, 3]);
		const b = rgba([9, 40, 210], [3, 2, 1]);
		expect(Array.from(differenceImage(a, b, { gain: 8 }).data)).toEqual(Array.from(differenceImage(b, a, { gain: 8 }).data));
	});

	it('maps the signed difference around mid-grey, lighter where the first is brighter, clipped both ways', () => {
		const a = rgba([110, 90, 255]);
		const b = rgba([100, 100, 0]);
		// +10 · 4 = +40 → 168; −10 · 4 = −40 → 88; +255 · 4 → clipped to 255.
		expect(Array.from(differenceImage(a, b, { gain: 4, signed: true }).data)).toEqual(Array.from(rgba([168, 88, 255])));
		// The reverse order mirrors about 128 and clips at 0.
		expect(Array.from(differenceImage(b, a, { gain: 4, signed: true }).data)).toEqual(Array.from(rgba([88, 168, 0])));
	});

	it('counts the pixels that differ and the largest difference before the gain', () => {
		const a = rgba([0, 0, 0], [50, 50, 50], [200, 10, 10]);
		const b = rgba([0, 0, 0], [50, 51, 50], [180, 10, 10]);
		const summary = differenceImage(a, b, { gain: 32 });
		expect(summary.differing).toBe(2);
		expect(summary.maxAbs).toBe(20);
		expect(summary.pixels).toBe(3);
	});

	it('ignores alpha and writes opaque pixels', () => {
		const a = new Uint8ClampedArray([10, 10, 10, 0]);
		const b = new Uint8ClampedArray([10, 10, 10, 255]);
		expect(Array.from(differenceImage(a, b).data)).toEqual([0, 0, 0, 255]);
	});

	it('writes into a given output buffer', () => {
		const output = new Uint8ClampedArray(4);
		const { data } = differenceImage(rgba([9, 9, 9]), rgba([1, 1, 1]), { gain: 2, output });
		expect(data).toBe(output);
		expect(Array.from(output)).toEqual([16, 16, 16, 255]);
	});

	it('refuses pictures of different sizes, non-RGBA input and an unknown gain', () => {
		expect(() => differenceImage(rgba([0, 0, 0]), rgba([0, 0, 0], [0, 0, 0]))).toThrow(RangeError);
		expect(() => differenceImage(new Uint8ClampedArray(3), new Uint8ClampedArray(3))).toThrow(/RGBA/);
		expect(() => differenceImage(rgba([0, 0, 0]), rgba([0, 0, 0]), { gain: 3 as DifferenceGain })).toThrow(/gain/);
		expect(() => differenceImage(rgba([0, 0, 0]), rgba([0, 0, 0]), { output: new Uint8ClampedArray(8) })).toThrow(/output/);
	});
});
