import { describe, expect, it } from 'vitest';
import { buildKernel } from '../kernels/build';
import { psnr } from '../metrics/psnr';
import { convolveValidNaive, crop, syntheticScene, withNoise } from '../testing/fixtures';
import type { RasterImage } from '../types';
import { ENGINE_VERSION } from '../version';
import { restore } from './restore';

function blurredImage(channels: 1 | 3) {
	const spec = { kind: 'line' as const, length: 7, angleDeg: 30 };
	const psf = buildKernel(spec);
	const [kh, kw] = psf.shape;
	const truths = [];
	const planes = [];
	for (let c = 0; c < channels; c++) {
		const big = syntheticScene(64 + kh - 1, 64 + kw - 1, 20 + c);
		truths.push(crop(big, (kh - 1) / 2, (kw - 1) / 2, 64, 64));
		const y = withNoise(convolveValidNaive(big, psf), 0.005, 30 + c);
		for (let i = 0; i < y.data.length; i++) y.data[i] = Math.min(1, Math.max(0, y.data[i]));
		planes.push(y);
	}
	const img: RasterImage = { width: 64, height: 64, planes, transfer: 'linear', sourceBitDepth: 16 };
	return { img, spec, truths };
}

describe('restore', () => {
	it('auto improves a noisy blurred image without the truth and records how', () => {
		const { img, spec, truths } = blurredImage(1);
		const { image, record } = restore(img, spec, { method: 'auto' });
		expect(psnr(truths[0], image.planes[0])).toBeGreaterThan(psnr(truths[0], img.planes[0]) + 1);
		expect(record.engineVersion).toBe(ENGINE_VERSION);
		expect(record.resolvedMethod).toBe('rltv');
		expect(record.kernel).toEqual(spec);
		expect(record.input.noiseSigma).toBeGreaterThan(0);
		expect(record.recoverability.note).toContain('%');
		expect(record.iterationsRun).toBeGreaterThan(0);
		expect(JSON.parse(JSON.stringify(record))).toEqual(record);
	});

	it('is deterministic: two runs of every method give identical bytes', () => {
		const { img, spec } = blurredImage(3);
		for (const method of ['wiener', 'rl', 'rltv'] as const) {
			const a = restore(img, spec, { method, iterations: 5 });
			const b = restore(img, spec, { method, iterations: 5 });
			for (let c = 0; c < 3; c++) expect(Buffer.from(a.image.planes[c].data.buffer).equals(Buffer.from(b.image.planes[c].data.buffer))).toBe(true);
			expect(a.record).toEqual(b.record);
		}
	});

	it('decodes sRGB to linear light by default and returns sRGB, with progress over all channels', () => {
		const { img, spec } = blurredImage(3);
		const srgb: RasterImage = { ...img, transfer: 'srgb', sourceBitDepth: 8 };
		const progress: number[] = [];
		const { image, record } = restore(srgb, spec, { method: 'rl', iterations: 3, stopping: { relativeChange: 0 } }, { onProgress: (d, t) => progress.push(d / t) });
		expect(image.transfer).toBe('srgb');
		expect(record.colour).toEqual({ linearLight: true, channels: 3 });
		expect(progress.length).toBe(9);
		expect(progress.at(-1)).toBe(1);
		for (let i = 1; i < progress.length; i++) expect(progress[i]).toBeGreaterThan(progress[i - 1]);
	});

	it('rejects bad specs and options with RangeError, and honours AbortSignal', () => {
		const { img, spec } = blurredImage(1);
		expect(() => restore(img, { kind: 'disk', radius: -1 }, { method: 'wiener' })).toThrow(/disk radius must be positive/);
		expect(() => restore(img, spec, { method: 'rl', tv: 0.01 })).toThrow(RangeError);
		expect(() => restore(img, spec, { method: 'wiener', nsr: -1 })).toThrow(RangeError);
		expect(() => restore(img, spec, { method: 'magic' as never })).toThrow(RangeError);
		const controller = new AbortController();
		controller.abort(new Error('stop'));
		expect(() => restore(img, spec, { method: 'rl' }, { signal: controller.signal })).toThrow('stop');
	});
});
