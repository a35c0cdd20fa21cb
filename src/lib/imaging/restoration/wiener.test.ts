import { describe, expect, it } from 'vitest';
import { buildKernel } from '../kernels/build';
import { psnr } from '../metrics/psnr';
import { convolveCircularNaive, convolveValidNaive, crop, syntheticScene } from '../testing/fixtures';
import { createPlane } from '../types';
import { wienerDeconvolve } from './wiener';

/** A 3×3 kernel whose OTF, 0.6 + 0.2·cos(2πu) + 0.2·cos(2πv) ≥ 0.2, never vanishes: invertible. */
function invertibleKernel() {
	const k = createPlane(3, 3);
	k.set(1, 1, 0.6);
	for (const [i, j] of [[0, 1], [2, 1], [1, 0], [1, 2]]) k.set(i, j, 0.1);
	return k;
}

function maxAbs(a: Float32Array, b: Float32Array): number {
	let m = 0;
	for (let i = 0; i < a.length; i++) m = Math.max(m, Math.abs(a[i] - b[i]));
	return m;
}

describe('wienerDeconvolve', () => {
	it('with NSR = 0 and an invertible kernel is the inverse filter: returns the input to float precision (circular)', () => {
		// Gonzalez & Woods, Digital Image Processing §5.8: Wiener with K = 0 reduces to the inverse filter.
		for (const [h, w] of [[32, 48], [30, 45]]) {
			const x = syntheticScene(h, w, 3);
			const y = convolveCircularNaive(x, invertibleKernel());
			const restored = wienerDeconvolve(y, invertibleKernel(), { nsr: 0, boundary: 'circular' });
			expect(maxAbs(restored.data, x.data)).toBeLessThan(2e-6);
		}
	});

	it('non-circular boundary beats the circular model on a cropped (non-periodic) blur', () => {
		// Liu & Jia, ICIP 2008 / Reeves, ICIP 2005: treating a cropped photo as periodic makes the borders ring.
		const psf = buildKernel({ kind: 'line', length: 11, angleDeg: 20 });
		const [kh, kw] = psf.shape;
		const big = syntheticScene(96 + kh - 1, 96 + kw - 1, 5);
		const y = convolveValidNaive(big, psf);
		const truth = crop(big, (kh - 1) / 2, (kw - 1) / 2, 96, 96);
		const tapered = psnr(truth, wienerDeconvolve(y, psf, { nsr: 1e-3 }));
		const circular = psnr(truth, wienerDeconvolve(y, psf, { nsr: 1e-3, boundary: 'circular' }));
		expect(tapered).toBeGreaterThan(circular + 3);
		expect(tapered).toBeGreaterThan(psnr(truth, y) + 3);
	});

	it('the Laplacian regulariser smooths more than the same constant weight at high frequencies', () => {
		const psf = buildKernel({ kind: 'gaussian', sigma: 1.5 });
		const y = syntheticScene(64, 64, 2);
		const a = wienerDeconvolve(y, psf, { nsr: 0.01, regulariser: 'laplacian' });
		const b = wienerDeconvolve(y, psf, { nsr: 0.01 });
		expect(maxAbs(a.data, b.data)).toBeGreaterThan(1e-3);
	});

	it('guards its arguments with RangeError', () => {
		const psf = buildKernel({ kind: 'disk', radius: 4 });
		const y = syntheticScene(32, 32);
		expect(() => wienerDeconvolve(y, psf, { nsr: -1 })).toThrow(RangeError);
		expect(() => wienerDeconvolve(createPlane(4, 4), psf)).toThrow(RangeError);
		expect(() => wienerDeconvolve(y, psf, { boundary: 'mirror' as never })).toThrow(RangeError);
	});
});
