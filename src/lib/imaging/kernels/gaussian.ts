import type { Plane } from '../types';
import { KERNEL_LIMITS } from './spec';
import { KernelGrid } from './raster';

/** Truncation radius in standard deviations: the discarded mass is below 1e-4 (common practice, no source). */
const TRUNCATE_SIGMAS = 4;

/**
 * Isotropic Gaussian PSF, g(x, y) ∝ exp(−(x² + y²) / 2σ²), sampled at pixel centres out to 4σ and
 * normalised. Its transfer function is H(ρ) = exp(−2π²σ²ρ²) with ρ in cycles/pixel
 * (Gonzalez & Woods, Digital Image Processing, 4th ed., 2018, §4.8, Gaussian lowpass filter).
 * Point sampling is used because a Gaussian is smooth at the pixel scale; for σ below about 0.5 the
 * kernel approaches a single tap.
 * @throws RangeError for sigma outside (0, 128].
 */
export function gaussianKernel(sigma: number): Plane {
	if (!(sigma > 0 && sigma <= KERNEL_LIMITS.maxSigma)) {
		throw new RangeError(`gaussian sigma must lie in (0, ${KERNEL_LIMITS.maxSigma}], got ${sigma}`);
	}
	const radius = Math.max(1, Math.ceil(TRUNCATE_SIGMAS * sigma));
	const grid = new KernelGrid(radius);
	for (let y = -radius; y <= radius; y++) {
		for (let x = -radius; x <= radius; x++) grid.add(x, y, Math.exp(-(x * x + y * y) / (2 * sigma * sigma)));
	}
	return grid.toKernel();
}
