import { describe, expect, it } from 'vitest';
import { buildKernel } from '../imaging/kernels/build';
import { kernelAtScale, previewOptions, PREVIEW_ITERATIONS } from './region-preview';
import { loadPreviewFft, previewRegion } from './region-restore';

function flatRgba(width: number, height: number, level: number): Uint8ClampedArray {
	const rgba = new Uint8ClampedArray(width * height * 4);
	for (let i = 0; i < width * height; i++) rgba.set([level, level, level, 255], 4 * i);
	return rgba;
}

describe('previewRegion', () => {
	it('keeps the size and leaves a flat field flat (deconvolution of a constant is the constant)', () => {
		const answer = previewRegion({ id: 1, width: 48, height: 32, rgba: flatRgba(48, 32, 128), psf: { kind: 'line', length: 9, angleDeg: 30 }, options: { method: 'wiener', nsr: 0.01 } });
		expect(answer.ok).toBe(true);
		if (!answer.ok) return;
		expect([answer.width, answer.height, answer.rgba.length]).toEqual([48, 32, 48 * 32 * 4]);
		for (let i = 0; i < answer.rgba.length; i += 4) expect(Math.abs(answer.rgba[i] - 128)).toBeLessThanOrEqual(1);
	});

	it('uses PFFFT when its WASM loads, and shows the same picture as fft.js to within one 8-bit code', async () => {
		// Reference: the same request through the engine's fft.js / ndarray-fft backend (Float64); PFFFT is
		// float32, so the 8-bit output may differ by rounding, never by more than one code.
		const width = 96;
		const height = 80;
		const rgba = new Uint8ClampedArray(width * height * 4);
		for (let i = 0; i < width * height; i++) rgba.set([(i * 7) % 251, (i * 13) % 241, 128 + ((i % width) % 64), 255], 4 * i);
		const request = { id: 3, width, height, rgba, psf: { kind: 'line' as const, length: 9, angleDeg: 30 }, options: { method: 'wiener' as const, nsr: 0.01 } };
		const fft = await loadPreviewFft();
		const ours = previewRegion(request, fft);
		const reference = previewRegion(request);
		if (!ours.ok || !reference.ok) throw new Error('preview failed');
		expect(ours.fft).toMatch(/^pffft-wasm/);
		expect(reference.fft).toMatch(/^fft\.js/);
		let worst = 0;
		for (let i = 0; i < ours.rgba.length; i++) worst = Math.max(worst, Math.abs(ours.rgba[i] - reference.rgba[i]));
		expect(worst).toBeLessThanOrEqual(1);
	});

	it('refuses a region larger than the preview allows, with a reason', () => {
		const answer = previewRegion({ id: 2, width: 2000, height: 10, rgba: new Uint8ClampedArray(0), psf: { kind: 'disk', radius: 2 }, options: { method: 'wiener' } });
		expect(answer).toMatchObject({ ok: false, error: expect.stringContaining('1024') });
	});
});

describe('kernelAtScale', () => {
	it('shrinks a kernel by the preview scale and never enlarges one', () => {
		expect(kernelAtScale({ kind: 'line', length: 20, angleDeg: 15 }, 0.5)).toEqual({ kind: 'line', length: 10, angleDeg: 15 });
		expect(kernelAtScale({ kind: 'disk', radius: 4 }, 0.25)).toEqual({ kind: 'disk', radius: 1 });
		expect(kernelAtScale({ kind: 'gaussian', sigma: 3 }, 2)).toEqual({ kind: 'gaussian', sigma: 3 });
		const half = kernelAtScale({ kind: 'path', points: [[0, 0], [10, 4]] }, 0.5);
		expect(Array.from(buildKernel(half).data)).toEqual(Array.from(buildKernel({ kind: 'path', points: [[0, 0], [5, 2]] }).data));
	});
});

describe('previewOptions', () => {
	it('passes the run settings through and shortens Richardson–Lucy', () => {
		expect(previewOptions({ method: 'wiener', psf: { kind: 'disk', radius: 2 }, params: { nsr: 'auto', linearLight: true } })).toEqual({ method: 'wiener', nsr: 'auto', linearLight: true });
		expect(previewOptions({ method: 'rl', psf: { kind: 'disk', radius: 2 }, params: { iterations: 200 } })).toEqual({ method: 'rl', iterations: PREVIEW_ITERATIONS });
	});
});
