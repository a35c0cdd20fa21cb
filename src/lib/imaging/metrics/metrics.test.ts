import { ssim as ssimJs } from 'ssim.js';
import { describe, expect, it } from 'vitest';
import { seededRandom, syntheticScene } from '../testing/fixtures';
import { createPlane, type Plane } from '../types';
import { psnr } from './psnr';
import { ssim } from './ssim';

/** Grey 8-bit RGBA ImageData for ssim.js (R = G = B, so its integer grey conversion returns the value). */
function toImageData(p: Plane): { data: Uint8ClampedArray; width: number; height: number } {
	const [h, w] = p.shape;
	const data = new Uint8ClampedArray(4 * h * w);
	for (let i = 0; i < h * w; i++) {
		const v = Math.round(p.data[i] * 255);
		data.set([v, v, v, 255], 4 * i);
	}
	return { data, width: w, height: h };
}

function quantised(p: Plane): Plane {
	const out = createPlane(p.shape[0], p.shape[1]);
	for (let i = 0; i < out.data.length; i++) out.data[i] = Math.round(p.data[i] * 255) / 255;
	return out;
}

describe('metrics', () => {
	it('SSIM equals ssim.js 3.5.0 (original Wang et al. algorithm, no downsampling, 11×11 Gaussian σ = 1.5)', () => {
		const a = quantised(syntheticScene(40, 52, 1));
		const rand = seededRandom(2);
		const b = createPlane(40, 52);
		for (let i = 0; i < b.data.length; i++) b.data[i] = Math.min(1, Math.max(0, a.data[i] + (rand() - 0.5) * 0.2));
		const bq = quantised(b);
		// ssim.js 3.5.0 options matching Wang et al. 2004: ssim 'original', downsample false, K1 0.01, K2 0.03, L = 255.
		const reference = ssimJs(toImageData(a), toImageData(bq), { ssim: 'original', downsample: false, windowSize: 11, k1: 0.01, k2: 0.03, bitDepth: 8 }).mssim;
		expect(Math.abs(ssim(a, bq) - reference)).toBeLessThan(1e-5);
		expect(ssim(a, a)).toBeCloseTo(1, 12);
	});

	it('PSNR follows 10·log10(peak²/MSE) (Wang & Bovik 2009)', () => {
		const a = createPlane(4, 4);
		const b = createPlane(4, 4);
		b.data.fill(0.1);
		expect(psnr(a, b)).toBeCloseTo(20, 5);
		expect(psnr(a, b, 255)).toBeCloseTo(10 * Math.log10(255 ** 2 / 0.01), 4);
		expect(psnr(a, a)).toBe(Infinity);
	});

	it('guards shapes and options with RangeError', () => {
		expect(() => psnr(createPlane(2, 2), createPlane(2, 3))).toThrow(RangeError);
		expect(() => ssim(createPlane(8, 8), createPlane(8, 8))).toThrow(RangeError);
		expect(() => ssim(createPlane(20, 20), createPlane(20, 20), { windowSize: 4 })).toThrow(RangeError);
	});
});
