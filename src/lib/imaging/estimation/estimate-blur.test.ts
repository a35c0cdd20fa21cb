import { describe, expect, it } from 'vitest';
import { buildKernel } from '../kernels/build';
import { syntheticScene } from '../testing/fixtures';
import { createPlane } from '../types';
import { estimateBlur } from './estimate-blur';
import { GAUSSIAN_CONFIDENCE_CAP } from './gaussian';
import { addNoise, blurredScene, deadLeaves } from './testing';

describe('estimateBlur robustness (issue 7)', () => {
	it('reports no confident blur, and no kernel, for sharp images', () => {
		for (const sharp of [addNoise(deadLeaves(512, 512, 3), 0.005, 4), addNoise(syntheticScene(512, 512, 3), 0.005, 4)]) {
			const result = estimateBlur(sharp);
			expect(result.verdict).toBe('no-confident-blur');
			expect(result.proposals).toEqual([]);
			expect(result.notes.some((n) => n.startsWith('No confident blur'))).toBe(true);
		}
	});

	it('answers a flat grey image clearly, without an exception', () => {
		const flat = createPlane(300, 300);
		flat.data.fill(0.5);
		const result = estimateBlur(flat);
		expect(result.verdict).toBe('no-confident-blur');
		expect(result.notes.join(' ')).toMatch(/uniform/);
		expect(result.noise).toEqual({ immerkaer: 0, mad: 0, nsr: null, sigma: 0 });
	});

	it.each([
		[1, 1],
		[2, 2],
		[63, 200]
	])('answers a %s×%s image with a note naming the 64×64 minimum', (height, width) => {
		const result = estimateBlur(addNoise(createPlane(height, width), 0.01, 1));
		expect(result.verdict).toBe('no-confident-blur');
		expect(result.spectrum).toBeNull();
		expect(result.notes.join(' ')).toMatch(/64×64/);
	});

	it('notes non-finite input instead of throwing', () => {
		const p = addNoise(createPlane(128, 128), 0.01, 2);
		p.data[77] = Number.NaN;
		expect(estimateBlur(p).notes.join(' ')).toMatch(/non-finite/);
	});

	it('rejects a region outside the image and invalid thresholds', () => {
		const p = createPlane(100, 100);
		expect(() => estimateBlur(p, { region: { x: 50, y: 0, width: 64, height: 64 } })).toThrow(RangeError);
		expect(() => estimateBlur(p, { region: { x: 0.5, y: 0, width: 64, height: 64 } })).toThrow(RangeError);
		expect(() => estimateBlur(p, { minConfidence: 2 })).toThrow(RangeError);
	});
});

describe('estimateBlur regions, Gaussian fall-off and overlay', () => {
	it('reads the blur of the selected region only', () => {
		// Left half sharp, right half motion-blurred: blur that differs across a photo.
		const sharp = addNoise(deadLeaves(384, 384, 8), 0.005, 9);
		const blurred = blurredScene(buildKernel({ kind: 'line', length: 20, angleDeg: 45 }), 384, 0.005, 10);
		const both = createPlane(384, 768);
		for (let i = 0; i < 384; i++) {
			both.data.set(sharp.data.subarray(i * 384, (i + 1) * 384), i * 768);
			both.data.set(blurred.data.subarray(i * 384, (i + 1) * 384), i * 768 + 384);
		}
		const right = estimateBlur(both, { region: { x: 384, y: 0, width: 384, height: 384 } });
		expect(right.verdict).toBe('motion');
		expect(right.region).toEqual({ x: 384, y: 0, width: 384, height: 384 });
		expect(estimateBlur(both, { region: { x: 0, y: 0, width: 384, height: 384 } }).verdict).toBe('no-confident-blur');
	});

	it('proposes a Gaussian from the fall-off, at a confidence no higher than the cap (Gonzalez & Woods §4.8)', () => {
		const result = estimateBlur(blurredScene(buildKernel({ kind: 'gaussian', sigma: 2.5 }), 512, 0.005, 30));
		expect(result.verdict).toBe('gaussian');
		const [proposal] = result.proposals;
		if (proposal.kernel.kind !== 'gaussian') throw new Error('expected a gaussian');
		expect(Math.abs(proposal.kernel.sigma / 2.5 - 1)).toBeLessThan(0.2);
		expect(proposal.confidence).toBeLessThanOrEqual(GAUSSIAN_CONFIDENCE_CAP);
		expect(proposal.method).toBe('spectral-falloff');
	});

	it('returns overlay data a UI can draw: a 256×256 spectrum in [0, 1] and marks inside it', () => {
		const result = estimateBlur(blurredScene(buildKernel({ kind: 'line', length: 16, angleDeg: 120 }), 512, 0.005, 31));
		const { overlay } = result.proposals[0];
		expect(overlay.spectrum).toBe(result.spectrum);
		expect(overlay.spectrum.width).toBe(256);
		expect(overlay.spectrum.data.length).toBe(256 * 256);
		expect(Math.min(...overlay.spectrum.data)).toBeGreaterThanOrEqual(0);
		expect(Math.max(...overlay.spectrum.data)).toBeLessThanOrEqual(1);
		for (const mark of overlay.marks) {
			const xs = mark.kind === 'segment' ? [mark.x1, mark.x2, mark.y1, mark.y2] : [mark.cx - mark.r, mark.cx + mark.r];
			for (const v of xs) expect(v >= 0 && v <= 256).toBe(true);
		}
		expect(overlay.profile!.observed.length).toBe(overlay.profile!.model.length);
	});
});
