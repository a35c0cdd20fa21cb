import { describe, expect, it } from 'vitest';
import { buildKernel } from '../kernels/build';
import { transferFunction } from './transfer';
import { recoverability } from './recoverability';

describe('transferFunction', () => {
	it('straight motion of odd integer length L: |H(k)| = |sin(πkL/N) / (L·sin(πk/N))| (Gonzalez & Woods, Digital Image Processing §5.6)', () => {
		const N = 64;
		for (const L of [5, 9, 15]) {
			const tf = transferFunction(buildKernel({ kind: 'line', length: L, angleDeg: 0 }), [8, N]);
			const mag = tf.magnitude();
			for (let k = 1; k < N; k++) {
				const expected = Math.abs(Math.sin((Math.PI * k * L) / N) / (L * Math.sin((Math.PI * k) / N)));
				expect(Math.abs(mag[k] - expected)).toBeLessThan(1e-6);
			}
		}
		// Vertical motion: the same law along the row-frequency axis.
		const vertical = transferFunction(buildKernel({ kind: 'line', length: 9, angleDeg: 90 }), [N, 8]).magnitude();
		for (let k = 1; k < N; k++) {
			const expected = Math.abs(Math.sin((Math.PI * k * 9) / N) / (9 * Math.sin((Math.PI * k) / N)));
			expect(Math.abs(vertical[k * 8] - expected)).toBeLessThan(1e-6);
		}
	});

	it('uniform disk radius R: first zero at ρ = 3.8317/(2πR) cycles/pixel within 3 % (Cannon 1976)', () => {
		const N = 512;
		for (const R of [6, 10]) {
			const mag = transferFunction(buildKernel({ kind: 'disk', radius: R }), [N, N]).magnitude();
			let k = 1;
			while (k < N / 2 && !(mag[k] < mag[k - 1] && mag[k] <= mag[k + 1])) k++;
			const rho = k / N;
			expect(Math.abs(rho / (3.8317 / (2 * Math.PI * R)) - 1)).toBeLessThan(0.03);
			expect(mag[k]).toBeLessThan(0.02);
		}
	});

	it('Gaussian σ: H(ρ) = exp(−2π²σ²ρ²) to 1e-4 (Gonzalez & Woods §4.8)', () => {
		const N = 128;
		const sigma = 2;
		const tf = transferFunction(buildKernel({ kind: 'gaussian', sigma }), [N, N]);
		const mag = tf.magnitude();
		for (const [k, l] of [[0, 5], [7, 0], [9, 12], [30, 30]]) {
			const rho = Math.hypot(k / N, l / N);
			expect(Math.abs(mag[k * N + l] - Math.exp(-2 * Math.PI ** 2 * sigma ** 2 * rho ** 2))).toBeLessThan(1e-4);
			// A symmetric kernel centred at the origin has a real OTF (Goodman, Fourier Optics §6.3).
			expect(Math.abs(tf.im[k * N + l])).toBeLessThan(1e-7);
		}
	});

	it('rejects a grid smaller than the kernel', () => {
		expect(() => transferFunction(buildKernel({ kind: 'disk', radius: 5 }), [8, 8])).toThrow(RangeError);
	});
});

describe('recoverability', () => {
	it('a horizontal motion blur loses frequencies that vary horizontally, more with more noise', () => {
		const psf = buildKernel({ kind: 'line', length: 15, angleDeg: 0 });
		const quiet = recoverability(psf, [512, 512], 0.001);
		const noisy = recoverability(psf, [512, 512], 0.02);
		expect(noisy.lostFraction).toBeGreaterThan(quiet.lostFraction);
		expect(noisy.worstDirectionsDeg[0] === 5 || noisy.worstDirectionsDeg[0] === 175).toBe(true);
		expect(noisy.threshold).toBeCloseTo(0.02 / 0.2, 12);
		expect(noisy.note).toContain('not recovered, only regularised');
	});

	it('a 45° motion is worst at 45°, and a delta loses nothing', () => {
		const diag = recoverability(buildKernel({ kind: 'line', length: 21, angleDeg: 45 }), [256, 256], 0.01);
		expect(diag.worstDirectionsDeg[0]).toBe(45);
		// A motion at 20° lies on the border of the 10° bins: its two neighbours come first. The first
		// zero along φ is at ρ = 1/(L·|cos(φ − θ)|) (Gonzalez & Woods §5.6), lowest along θ itself.
		const tilted = recoverability(buildKernel({ kind: 'line', length: 15, angleDeg: 20 }), [512, 512], 0.0109);
		expect([...tilted.worstDirectionsDeg.slice(0, 2)].sort()).toEqual([15, 25]);
		const delta = recoverability(buildKernel({ kind: 'gaussian', sigma: 0.1 }), [64, 64], 0.01);
		expect(delta.lostFraction).toBe(0);
		expect(() => recoverability(delta as never, [64, 64], -1)).toThrow();
	});

	it('an isotropic blur (disk, Gaussian) names no worst direction and says every direction is hit alike', () => {
		for (const spec of [{ kind: 'disk', radius: 5 }, { kind: 'gaussian', sigma: 3 }] as const) {
			const report = recoverability(buildKernel(spec), [256, 256], 0.01);
			expect(report.lostFraction).toBeGreaterThan(0.5);
			expect(report.worstDirectionsDeg).toEqual([]);
			expect(report.note).toContain('Every direction is affected alike');
		}
	});
});
