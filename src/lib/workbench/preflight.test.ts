import { describe, expect, it } from 'vitest';
import { preflightWarnings } from './preflight';

const clean = { format: 'png', width: 800, height: 600, analysis: { clippedFraction: 0.001, noiseSigma: [0.004, 0.005, 0.004] } };

describe('preflightWarnings', () => {
	it('is silent for a clean, small PNG', () => {
		expect(preflightWarnings(clean, 2048)).toEqual([]);
	});

	it('names each limiting condition once', () => {
		const codes = preflightWarnings(
			{ format: 'jpeg', width: 4000, height: 3000, analysis: { clippedFraction: 0.05, noiseSigma: [0.01, 0.03] } },
			2048
		).map((w) => w.code);
		expect(codes).toEqual(['clipped', 'jpeg', 'noise', 'larger-than-preview']);
	});

	it('uses strict thresholds: exactly 1 % clipped is not a warning', () => {
		expect(preflightWarnings({ ...clean, analysis: { clippedFraction: 0.01, noiseSigma: [] } }, 2048)).toEqual([]);
	});

	it('copes with an item that has no analysis', () => {
		expect(preflightWarnings({ ...clean, analysis: null }, 2048)).toEqual([]);
	});
});
