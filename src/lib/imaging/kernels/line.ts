import type { Plane } from '../types';
import { KERNEL_LIMITS } from './spec';
import { KernelGrid } from './raster';

/**
 * Straight-motion kernel of length L pixels at θ degrees counter-clockwise from +x on screen.
 * Each pixel p gets (length of [t_p − ½, t_p + ½] ∩ [−L/2, L/2]) · max(0, 1 − |d_p|), where t_p is
 * p's coordinate along the motion and d_p its distance across it: box coverage along the path,
 * linear (tent) anti-aliasing across it. An axis-aligned odd integer L gives the exact box of L
 * taps whose DFT is |sin(πkL/N) / (L·sin(πk/N))| (Gonzalez & Woods, Digital Image Processing,
 * 4th ed., Pearson 2018, §5.6), and the kernel is point-symmetric, so its centroid is the centre.
 * Screen y points down, so the direction vector in image coordinates is (cos θ, −sin θ).
 * @throws RangeError for a non-positive or too long length, or a non-finite angle.
 */
export function lineKernel(length: number, angleDeg: number): Plane {
	if (!(length > 0 && length <= KERNEL_LIMITS.maxLength)) {
		throw new RangeError(`line length must lie in (0, ${KERNEL_LIMITS.maxLength}], got ${length}`);
	}
	if (!Number.isFinite(angleDeg)) throw new RangeError(`line angle must be finite, got ${angleDeg}`);
	const theta = (angleDeg * Math.PI) / 180;
	const dx = Math.cos(theta);
	const dy = -Math.sin(theta);
	const half = length / 2;
	const radius = Math.ceil(half + 1.5);
	const grid = new KernelGrid(radius);
	for (let y = -radius; y <= radius; y++) {
		for (let x = -radius; x <= radius; x++) {
			const t = x * dx + y * dy;
			const d = Math.abs(-x * dy + y * dx);
			const along = Math.min(t + 0.5, half) - Math.max(t - 0.5, -half);
			// Ignore round-off slivers (cos 90° ≈ 6e-17) so axis-aligned lines stay one pixel wide.
			if (along > 1e-9 && 1 - d > 1e-9) grid.add(x, y, along * (1 - d));
		}
	}
	return grid.toKernel();
}
