import { describe, expect, it } from 'vitest';
import { seededGaussian } from '../testing/fixtures';
import { createPlane } from '../types';
import { clippedFraction } from './clipping';
import { estimateNoiseSigma } from './noise';

describe('estimateNoiseSigma (Immerkær 1996)', () => {
	it('recovers the σ of white Gaussian noise on a flat plane within 3 %', () => {
		// Immerkær 1996, CVIU 64(2): σ = √(π/2)·Σ|I∗M| / (6(W−2)(H−2)) is unbiased for Gaussian noise.
		for (const sigma of [0.003, 0.01, 0.05]) {
			const g = seededGaussian(3);
			const p = createPlane(256, 256);
			for (let i = 0; i < p.data.length; i++) p.data[i] = 0.5 + sigma * g();
			expect(Math.abs(estimateNoiseSigma(p) / sigma - 1)).toBeLessThan(0.03);
		}
	});

	it('is zero on a linear ramp, which the difference-of-Laplacians mask annihilates (Immerkær 1996)', () => {
		const p = createPlane(32, 40);
		for (let i = 0; i < 32; i++) for (let j = 0; j < 40; j++) p.data[i * 40 + j] = (0.01 * i + 0.005 * j) / 2;
		expect(estimateNoiseSigma(p)).toBeLessThan(1e-6);
	});

	it('rejects planes smaller than 3×3', () => {
		expect(() => estimateNoiseSigma(createPlane(2, 10))).toThrow(RangeError);
	});
});

describe('clippedFraction', () => {
	const grey = (values: number[], transfer: 'srgb' | 'linear' = 'srgb') => ({
		width: values.length,
		height: 1,
		planes: [createPlane(1, values.length, Float32Array.from(values))],
		transfer,
		sourceBitDepth: 8 as const
	});

	it('counts pixels at the top 8-bit code in any channel (common practice, no source)', () => {
		expect(clippedFraction(grey([0, 0.5, 1, 1]))).toBe(0.5);
		const rgb = {
			width: 2,
			height: 1,
			planes: [createPlane(1, 2, Float32Array.from([1, 0])), createPlane(1, 2, Float32Array.from([0, 0])), createPlane(1, 2, Float32Array.from([0, 1]))],
			transfer: 'srgb' as const,
			sourceBitDepth: 8 as const
		};
		expect(clippedFraction(rgb)).toBe(1);
	});

	it('honours an explicit level and rejects a bad one', () => {
		expect(clippedFraction(grey([0.2, 0.8, 0.9]), { level: 0.8 })).toBeCloseTo(2 / 3, 12);
		expect(() => clippedFraction(grey([0.2]), { level: 1.5 })).toThrow(RangeError);
	});
});
