import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import ndarray from 'ndarray';
import { describe, expect, it } from 'vitest';
import { buildKernel, richardsonLucy, wienerDeconvolve, type Plane } from '../../imaging';

/**
 * Golden values from scikit-image, produced by tools/reference/skimage_golden.py (run with
 * Debian's /usr/bin/python3) and committed in fixtures/golden/skimage-deconvolution.json; the
 * versions that produced them are read from that file and shown in each test's name
 * (generated with skimage 0.19.3, scipy 1.10.1, numpy 1.24.2).
 */
interface Golden {
	generator: string;
	versions: Record<string, string>;
	input: { width: number; height: number; scale: number; data: number[] };
	psf: { width: number; height: number; data: number[] };
	outputs: Record<'richardson_lucy' | 'wiener_laplacian' | 'wiener_constant', { call: string; data: number[] }>;
}

const golden: Golden = JSON.parse(readFileSync(resolve(import.meta.dirname, '../../../../fixtures/golden/skimage-deconvolution.json'), 'utf8'));
const { width: W, height: H } = golden.input;
const versions = `skimage ${golden.versions.skimage}, scipy ${golden.versions.scipy}, numpy ${golden.versions.numpy}`;
const observed: Plane = ndarray(Float32Array.from(golden.input.data, (v) => v / golden.input.scale), [H, W]);
const psf = buildKernel({ kind: 'image', width: golden.psf.width, height: golden.psf.height, data: golden.psf.data });

function maxAbsDiff(actual: Plane, expected: number[]): number {
	let worst = 0;
	for (let i = 0; i < H; i++) for (let j = 0; j < W; j++) worst = Math.max(worst, Math.abs(actual.get(i, j) - expected[i * W + j]));
	return worst;
}

describe(`scikit-image golden values (${golden.generator}; ${versions})`, () => {
	// Both sides agree on geometry: the 7×7 kernel's centre pixel is the origin. buildKernel crops
	// the explicit kernel to its support around that pixel, which changes no value.
	it('keeps the kernel centred on the same pixel as skimage.restoration.uft.ir2tf', () => {
		expect(psf.shape).toEqual([3, 5]);
		// Kernel planes are float32: agreement to float32 precision (≈ 3e-8 at 0.27).
		expect(psf.get(1, 2)).toBeCloseTo(golden.psf.data[3 * 7 + 3], 7);
	});

	/**
	 * skimage.restoration.wiener is circular (unitary rfft2 at the image size, transfer functions
	 * by ir2tf), so the matching setting is boundary 'circular'. Its default regulariser is the
	 * Laplacian [[0,−1,0],[−1,4,−1],[0,−1,0]], our 'laplacian'; reg = unit impulse is our 'constant'.
	 * Tolerance 1e-6: the engine stores planes in float32 (spacing 6e-8 near 1); the Wiener gain
	 * at this balance is at most 1/(2√0.05) ≈ 2.2 per frequency (|H|/(|H|²+b) peaks at 1/(2√b)),
	 * and FFT round-off grows like ε·log2(N) with N = 4096, so float32 input and output rounding
	 * stays below 1e-6 on values in [0, 1]. A boundary, sign or centring error is ≥ 1e-2.
	 */
	it.each([
		['wiener_laplacian', 'laplacian'],
		['wiener_constant', 'constant']
	] as const)(`Wiener matches %s (balance 0.05, circular) within 1e-6 — ${versions}`, (key, regulariser) => {
		const ours = wienerDeconvolve(observed, psf, { nsr: 0.05, regulariser, boundary: 'circular' });
		expect(maxAbsDiff(ours, golden.outputs[key].data)).toBeLessThan(1e-6);
	});

	// The tolerance separates boundary models: the engine's default (mirror padding with edge
	// taper) must not pass for skimage's circular filter. Common practice, no source.
	it('tells boundary modes apart: the default taper boundary differs from the circular reference', () => {
		const ours = wienerDeconvolve(observed, psf, { nsr: 0.05, regulariser: 'laplacian', boundary: 'taper' });
		expect(maxAbsDiff(ours, golden.outputs.wiener_laplacian.data)).toBeGreaterThan(1e-3);
	});

	/**
	 * skimage.restoration.richardson_lucy uses scipy.signal.convolve(mode='same'): zero outside
	 * the frame, a flat 0.5 start, no division by Hᵀ1. Its matching setting is assembled here from
	 * the public richardsonLucy primitive: the photo sits in a zero canvas large enough that the
	 * circular wrap only meets zeros, the start is 0.5 on the photo and 0 outside, acceleration
	 * and the stopping rule are off. The engine floors starting values at 1e-3 × the data mean
	 * (so RL can revive them); on a 512² canvas that floor is ≈ 6e-6 and is the only stand-in
	 * for skimage's exact zeros. Its effect falls as 1/side² (measured when this test was written:
	 * 128²: 4.4e-6, 256²: 1.1e-6, 512²: 2.8e-7, 1024²: 2.3e-7 largest difference), so at 512² it is
	 * at the level of float32 round-off. Multiplicative updates keep zero-data pixels from growing (y/Hx = 0 there).
	 * Tolerance 2e-6: 10 iterations of float32 multiplicative updates through two FFT
	 * convolutions each (relative rounding 6e-8 per operation, a few tens of operations per pixel
	 * per iteration) on values below 1.2. A boundary or centring error is ≥ 1e-2.
	 */
	it(`Richardson–Lucy matches richardson_lucy(num_iter=10, clip=False) within 2e-6 — ${versions}`, () => {
		const side = 512;
		const canvas = ndarray(new Float32Array(side * side), [side, side]);
		const start = ndarray(new Float32Array(side * side), [side, side]);
		for (let i = 0; i < H; i++) {
			for (let j = 0; j < W; j++) {
				canvas.set(i, j, observed.get(i, j));
				start.set(i, j, 0.5);
			}
		}
		const { plane, iterationsRun } = richardsonLucy(canvas, psf, {
			iterations: 10,
			accelerate: false,
			relativeChange: 0,
			boundary: 'circular',
			initial: start
		});
		expect(iterationsRun).toBe(10);
		expect(maxAbsDiff(plane.hi(H, W), golden.outputs.richardson_lucy.data)).toBeLessThan(2e-6);
	});
});
