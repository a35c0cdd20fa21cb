import { describe, expect, it } from 'vitest';
import { besselJ1, besselJ1Zeros, jinc } from './bessel';

describe('besselJ1 and the disk transfer function', () => {
	it('puts the first zero at x = 3.8317, so R = 0.6098·N/k0 (Cannon, IEEE TASSP 1976)', () => {
		const [first] = besselJ1Zeros(1);
		expect(first).toBeCloseTo(3.8317, 4);
		expect(first / (2 * Math.PI)).toBeCloseTo(0.6098, 4);
	});

	it('matches J1(1) = 0.4400506 and J1(10) = 0.0434727 (tabulated values, from memory)', () => {
		expect(besselJ1(1)).toBeCloseTo(0.4400506, 6);
		expect(besselJ1(10)).toBeCloseTo(0.0434727, 6);
	});

	it('is odd, and jinc(0) = 1 with jinc even (2·J1(x)/x → 1 as x → 0)', () => {
		expect(besselJ1(-2.5)).toBeCloseTo(-besselJ1(2.5), 12);
		expect(jinc(0)).toBe(1);
		expect(jinc(1e-9)).toBeCloseTo(1, 9);
		expect(jinc(-7.3)).toBeCloseTo(jinc(7.3), 12);
		// Table interpolation against direct evaluation: error ≤ h²/8·max|f''| with h = 1/128.
		for (const x of [0.37, 3.8317, 12.345, 99.9]) expect(Math.abs(jinc(x) - (2 * besselJ1(x)) / x)).toBeLessThan(2e-6);
	});

	it('has zeros about π apart (successive zeros of J1 approach spacing π)', () => {
		const zeros = besselJ1Zeros(6);
		for (let k = 1; k < zeros.length; k++) expect(Math.abs(zeros[k] - zeros[k - 1] - Math.PI)).toBeLessThan(0.05);
		for (const z of zeros) expect(Math.abs(besselJ1(z))).toBeLessThan(1e-10);
	});

	it('rejects bad input', () => {
		expect(() => besselJ1(Number.NaN)).toThrow(RangeError);
		expect(() => besselJ1Zeros(0)).toThrow(RangeError);
	});
});
