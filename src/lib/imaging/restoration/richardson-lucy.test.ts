import { describe, expect, it } from 'vitest';
import { FftJsBackend } from '../fft/fftjs-backend';
import { buildKernel } from '../kernels/build';
import { psnr } from '../metrics/psnr';
import { convolveCircularNaive, convolveValidNaive, crop, syntheticScene, withNoise } from '../testing/fixtures';
import { createPlane } from '../types';
import { chooseBlockSize, convolveSerial, type ConvolutionJob } from './block-convolution';
import { richardsonLucy } from './richardson-lucy';

const sum = (a: Float32Array) => a.reduce((s, v) => s + v, 0);

describe('block (overlap-save) convolution', () => {
	it('matches direct valid and circular convolution to 1e-6 (Oppenheim & Schafer §8.7.3)', () => {
		const psf = buildKernel({ kind: 'path', points: [[0, 0], [6, 3], [9, 9]] });
		const [kh, kw] = psf.shape;
		const x = syntheticScene(70, 83, 4);
		const kernel = Float64Array.from(psf.data);
		for (const outside of ['zero', 'wrap'] as const) {
			const outRows = outside === 'zero' ? 70 - kh + 1 : 70;
			const outCols = outside === 'zero' ? 83 - kw + 1 : 83;
			const out = new Float32Array(outRows * outCols);
			const job: ConvolutionJob = {
				src: x.data, srcRows: 70, srcCols: 83, out, outRows, outCols,
				rowOffset: outside === 'zero' ? 0 : -((kh - 1) >> 1), colOffset: outside === 'zero' ? 0 : -((kw - 1) >> 1),
				kernel, kernelRows: kh, kernelCols: kw, outside, blockSize: 32
			};
			convolveSerial(job, new FftJsBackend());
			const direct = outside === 'zero' ? convolveValidNaive(x, psf) : convolveCircularNaive(x, psf);
			let err = 0;
			for (let i = 0; i < out.length; i++) err = Math.max(err, Math.abs(out[i] - direct.data[i]));
			expect(err).toBeLessThan(1e-6);
		}
		expect(chooseBlockSize(33, 33, 3000, 4000)).toBeGreaterThanOrEqual(64);
	});
});

describe('richardsonLucy', () => {
	const psf = buildKernel({ kind: 'disk', radius: 3 });
	const truth = syntheticScene(48, 48, 9);
	const y = convolveCircularNaive(truth, psf);

	it('conserves total flux every iteration and stays non-negative (Richardson 1972 / Lucy 1974)', () => {
		for (const accelerate of [false, true]) {
			for (const iterations of [1, 5]) {
				const r = richardsonLucy(y, psf, { iterations, accelerate, boundary: 'circular', relativeChange: 0 });
				// Σ Hᵀ1·x = Σ y, with Hᵀ1 = Σ k = 1 for a periodic model; Float32 accumulation limits it to ~1e-6 relative.
				expect(Math.abs(sum(r.plane.data) / sum(y.data) - 1)).toBeLessThan(2e-5);
				expect(Math.min(...r.plane.data)).toBeGreaterThanOrEqual(0);
			}
		}
	});

	it('sharpens: PSNR rises over the blurred input, and acceleration gets there in fewer iterations (Biggs & Andrews 1997)', () => {
		const plain = psnr(truth, richardsonLucy(y, psf, { iterations: 10, accelerate: false, boundary: 'circular', relativeChange: 0 }).plane);
		const fast = psnr(truth, richardsonLucy(y, psf, { iterations: 10, accelerate: true, boundary: 'circular', relativeChange: 0 }).plane);
		expect(plain).toBeGreaterThan(psnr(truth, y) + 1);
		expect(fast).toBeGreaterThan(plain);
	});

	it('extended domain (Bertero & Boccacci 2005) beats the periodic model on a cropped blur', () => {
		const line = buildKernel({ kind: 'line', length: 9, angleDeg: 0 });
		const big = syntheticScene(64, 64 + 8, 12);
		const blurred = withNoise(convolveValidNaive(big, line), 0.002);
		for (let i = 0; i < blurred.data.length; i++) blurred.data[i] = Math.max(0, blurred.data[i]);
		const inner = crop(big, 0, 4, 64, 64);
		const ext = psnr(inner, richardsonLucy(blurred, line, { iterations: 20, boundary: 'extended' }).plane);
		const circ = psnr(inner, richardsonLucy(blurred, line, { iterations: 20, boundary: 'circular' }).plane);
		expect(ext).toBeGreaterThan(circ + 1);
	});

	it('RL-TV is smoother than plain RL on noise (Dey et al. 2006)', () => {
		const noisy = withNoise(y, 0.02);
		for (let i = 0; i < noisy.data.length; i++) noisy.data[i] = Math.max(0, noisy.data[i]);
		const tv = (p: Float32Array) => {
			let s = 0;
			for (let i = 0; i < 48; i++) for (let j = 0; j + 1 < 48; j++) s += Math.abs(p[i * 48 + j + 1] - p[i * 48 + j]);
			return s;
		};
		const plain = richardsonLucy(noisy, psf, { iterations: 15, relativeChange: 0 }).plane;
		const reg = richardsonLucy(noisy, psf, { iterations: 15, relativeChange: 0, tv: 0.02 }).plane;
		expect(tv(reg.data)).toBeLessThan(tv(plain.data));
	});

	it('reports progress every iteration, stops on the relative-change rule, and honours AbortSignal', () => {
		const calls: [number, number][] = [];
		const r = richardsonLucy(y, psf, { iterations: 4, relativeChange: 0, onProgress: (d, t) => calls.push([d, t]) });
		expect(calls).toEqual([[1, 4], [2, 4], [3, 4], [4, 4]]);
		expect(r.iterationsRun).toBe(4);
		const early = richardsonLucy(y, psf, { iterations: 50, relativeChange: 0.05 });
		expect(early.stoppedEarly).toBe(true);
		expect(early.iterationsRun).toBeLessThan(50);
		const controller = new AbortController();
		expect(() =>
			richardsonLucy(y, psf, { iterations: 10, onProgress: (d) => d === 2 && controller.abort(new Error('cancelled')), signal: controller.signal })
		).toThrow('cancelled');
	});

	it('is deterministic: two runs give identical bytes', () => {
		const a = richardsonLucy(y, psf, { iterations: 6, tv: 0.002 }).plane.data;
		const b = richardsonLucy(y, psf, { iterations: 6, tv: 0.002 }).plane.data;
		expect(Buffer.from(a.buffer).equals(Buffer.from(b.buffer))).toBe(true);
	});

	it('guards its arguments with RangeError', () => {
		expect(() => richardsonLucy(y, psf, { iterations: -1 })).toThrow(RangeError);
		expect(() => richardsonLucy(y, psf, { tv: 0.5 })).toThrow(RangeError);
		const negative = createPlane(16, 16);
		negative.data[3] = -0.1;
		expect(() => richardsonLucy(negative, psf)).toThrow(RangeError);
		expect(() => richardsonLucy(createPlane(3, 3), psf)).toThrow(RangeError);
	});
});
