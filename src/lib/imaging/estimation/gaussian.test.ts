import { describe, expect, it } from 'vitest';
import { analysisBand } from './band';
import { estimateGaussianFalloff, GAUSSIAN_CONFIDENCE_CAP } from './gaussian';

const N = 256;
const NOISE = 0.01;

/**
 * Power of a ρ^−2 scene (Field, JOSA A 1987) behind a Gaussian of σ px, H = exp(−2π²σ²ρ²)
 * (Gonzalez & Woods §4.8), plus `tail`·σ_n² of scene detail that fades slowly, plus white noise σ_n².
 */
function spectrum(sigma: number, tail = 0): Float64Array {
	const out = new Float64Array(N * N);
	for (let y = 0; y < N; y++) {
		for (let x = 0; x < N; x++) {
			const rho = Math.hypot(x - N / 2, y - N / 2) / N;
			out[y * N + x] = (1e-4 * Math.exp(-4 * Math.PI ** 2 * sigma ** 2 * rho ** 2)) / (rho * rho + 1e-4) + (1 + tail) * NOISE ** 2;
		}
	}
	return out;
}

describe('estimateGaussianFalloff', () => {
	it('recovers σ = 2.5 px from exp(−4π²σ²ρ²) on a ρ^−2 scene, and the drop into the noise agrees', () => {
		const power = spectrum(2.5);
		const g = estimateGaussianFalloff(power, N, analysisBand(power, N, NOISE), NOISE, { cameraSigma: 1 })!;
		expect(Math.abs(g.sigma / 2.5 - 1)).toBeLessThan(0.05);
		expect(g.tailAgreement).toBe(1);
		expect(g.confidence).toBeGreaterThan(0.9 * GAUSSIAN_CONFIDENCE_CAP);
	});

	it('doubts a fall-off whose scene detail fades slowly into the noise past the band', () => {
		// Half the noise power of detail is left past the band edge: a Gaussian would leave none.
		const power = spectrum(1.5, 0.5);
		const g = estimateGaussianFalloff(power, N, analysisBand(power, N, NOISE), NOISE, { cameraSigma: 1 })!;
		expect(g.tailAgreement).toBeLessThan(0.5);
		expect(g.confidence).toBeLessThan(0.3);
	});

	it('gives no confidence to a Gaussian no wider than the camera’s own (the null model of the comparison)', () => {
		const power = spectrum(1);
		const band = analysisBand(power, N, NOISE);
		expect(estimateGaussianFalloff(power, N, band, NOISE, { cameraSigma: 0 })!.confidence).toBeGreaterThan(0.5);
		expect(estimateGaussianFalloff(power, N, band, NOISE, { cameraSigma: 1.2 })!.confidence).toBe(0);
		expect(() => estimateGaussianFalloff(power, N, band, NOISE, { cameraSigma: -1 })).toThrow(RangeError);
	});
});
