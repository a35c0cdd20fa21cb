import { describe, expect, it } from 'vitest';
import { buildKernel } from '../kernels/build';
import type { KernelSpec } from '../kernels/spec';
import { psnr } from '../metrics/psnr';
import { convolveValidNaive, crop, syntheticScene, withNoise } from '../testing/fixtures';
import type { RasterImage } from '../types';
import { AUTO_TUNING, chooseAutoSettings } from './auto';
import { restore } from './restore';

describe('auto rule', () => {
	it('regularises more and iterates less as the noise grows, within its stated bounds', () => {
		// Bertero & Boccacci 1998 §7: for RL the iteration count is the regularisation parameter, so
		// more noise must mean fewer iterations; Dey et al. 2006: the TV weight grows with the noise.
		const plane = syntheticScene(48, 48, 5);
		const psf = buildKernel({ kind: 'disk', radius: 2 });
		const sigmas = [0, 0.001, 0.003, 0.006, 0.01, 0.02, 0.05];
		const chosen = sigmas.map((sigma) => {
			const s = chooseAutoSettings(plane, psf, sigma).settings;
			if (s.method !== 'rltv') throw new Error(`auto resolved to ${s.method}`);
			return s;
		});
		for (const s of chosen) {
			expect(s.boundary).toBe('extended');
			expect(s.iterations).toBeGreaterThanOrEqual(AUTO_TUNING.iterationRange[0]);
			expect(s.iterations).toBeLessThanOrEqual(AUTO_TUNING.iterationRange[1]);
			expect(s.tv).toBeGreaterThanOrEqual(AUTO_TUNING.tvRange[0]);
			expect(s.tv).toBeLessThanOrEqual(AUTO_TUNING.tvRange[1]);
		}
		for (let i = 1; i < chosen.length; i++) {
			const [a, b] = [chosen[i - 1], chosen[i]];
			expect(b.tv).toBeGreaterThanOrEqual(a.tv);
			expect(b.iterations).toBeLessThanOrEqual(a.iterations);
		}
		expect(chosen.at(-1)!.tv).toBeGreaterThan(chosen[0].tv);
		expect(chosen.at(-1)!.iterations).toBeLessThan(chosen[0].iterations);
	});

	it('never returns worse than the blurred input on seeded synthetic blurs at 0.3 % and 1 % noise', () => {
		// Issue 3's floor: auto must not fall below the blurred input. Kernels after Gonzalez & Woods
		// §5.6 (motion), Cannon 1976 (defocus disk) and §4.8 (Gaussian); 'valid' blur so no boundary
		// assumption enters the data.
		const specs: KernelSpec[] = [
			{ kind: 'line', length: 9, angleDeg: 20 },
			{ kind: 'disk', radius: 3 },
			{ kind: 'gaussian', sigma: 1.5 }
		];
		specs.forEach((spec, n) => {
			const psf = buildKernel(spec);
			const [kh, kw] = psf.shape;
			const big = syntheticScene(64 + kh - 1, 64 + kw - 1, 40 + n);
			const truth = crop(big, (kh - 1) / 2, (kw - 1) / 2, 64, 64);
			for (const sigma of [0.003, 0.01]) {
				const y = withNoise(convolveValidNaive(big, psf), sigma, 50 + n);
				for (let i = 0; i < y.data.length; i++) y.data[i] = Math.min(1, Math.max(0, y.data[i]));
				const img: RasterImage = { width: 64, height: 64, planes: [y], transfer: 'linear', sourceBitDepth: 16 };
				const { image } = restore(img, spec, { method: 'auto' });
				expect(psnr(truth, image.planes[0])).toBeGreaterThan(psnr(truth, y));
			}
		});
	});
});
