import { describe, expect, it } from 'vitest';
import { buildKernel } from '../kernels/build';
import type { AnalysisBand } from './band';
import { jinc } from './bessel';
import { estimateDefocus } from './defocus';
import { estimateBlur } from './estimate-blur';
import { blurredScene } from './testing';

const N = 256;
const BAND: AnalysisBand = { rMin: 3, rMax: 115 };

/**
 * Log power of a ρ^−2 scene behind a disk of radius R: |H| = |2·J1(2πRρ)/(2πRρ)| (Cannon 1976), the
 * zeros filled to 1 % as window leakage and noise fill them in a measured spectrum.
 */
function analyticDiskSpectrum(radius: number): Float64Array {
	const out = new Float64Array(N * N);
	for (let y = 0; y < N; y++) {
		for (let x = 0; x < N; x++) {
			const rho = Math.hypot(x - N / 2, y - N / 2) / N;
			out[y * N + x] = Math.log((jinc(2 * Math.PI * radius * rho) ** 2 + 1e-2) / (rho * rho + 1e-4));
		}
	}
	return out;
}

describe('estimateDefocus on analytic spectra', () => {
	it.each([4, 9.5, 20])('recovers R = %s px; the first dark ring is at ρ = 3.8317/(2πR) (Cannon, IEEE TASSP 1976)', (radius) => {
		const d = estimateDefocus(analyticDiskSpectrum(radius), N, BAND)!;
		expect(Math.abs(d.radius - radius)).toBeLessThan(0.06);
		expect(d.confidence).toBeGreaterThan(0.9);
		const ring = d.marks.find((m) => m.kind === 'circle' && m.role === 'zero');
		if (ring?.kind !== 'circle') throw new Error('no ring mark');
		expect(ring.r).toBeCloseTo((3.8317 * N) / (2 * Math.PI * d.radius), 2);
		expect(ring.r).toBeCloseTo((0.6098 * N) / d.radius, 1);
	});

	it('gives no confidence to a smooth power law without rings', () => {
		const plain = new Float64Array(N * N);
		for (let y = 0; y < N; y++) for (let x = 0; x < N; x++) plain[y * N + x] = -2 * Math.log(Math.hypot(x - N / 2, y - N / 2) / N + 1e-3);
		expect(estimateDefocus(plain, N, BAND)?.confidence ?? 0).toBe(0);
	});
});

describe('estimateBlur on defocused photographs (issue 7 target: median ≤ 0.5 px)', () => {
	it('recovers radii 8–14 px at noise σ 0.2 %, each within 0.6 px', () => {
		const errors = [8, 11, 14].map((radius, i) => {
			const result = estimateBlur(blurredScene(buildKernel({ kind: 'disk', radius }), 512, 0.002, 60 + i));
			expect(result.verdict).toBe('defocus');
			const kernel = result.proposals[0].kernel;
			if (kernel.kind !== 'disk') throw new Error(`expected a disk, got ${kernel.kind}`);
			return Math.abs(kernel.radius - radius);
		});
		expect(Math.max(...errors)).toBeLessThan(0.6);
		expect([...errors].sort((a, b) => a - b)[1]).toBeLessThanOrEqual(0.5);
	});
});
