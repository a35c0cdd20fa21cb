import type { Plane } from '../types';
import { KERNEL_LIMITS } from './spec';
import { KernelGrid } from './raster';

/** Sub-samples per pixel axis for pixels the disk edge crosses. */
const SUPERSAMPLE = 16;

/**
 * Uniform defocus disk (pillbox) of radius R pixels: each pixel holds the share of its area inside
 * the circle, measured on a 16×16 sub-pixel grid for pixels the edge crosses (inner pixels are 1).
 * Its transfer function approaches 2·J1(2πRρ)/(2πRρ), first zero at ρ = 3.8317/(2πR)
 * (M. Cannon, "Blind deconvolution of spatially invariant image blurs with phase",
 * IEEE Trans. ASSP 24(1):58–63, 1976, doi:10.1109/TASSP.1976.1162770).
 * @throws RangeError for a radius outside (0, 256].
 */
export function diskKernel(radius: number): Plane {
	if (!(radius > 0 && radius <= KERNEL_LIMITS.maxRadius)) {
		throw new RangeError(`disk radius must lie in (0, ${KERNEL_LIMITS.maxRadius}], got ${radius}`);
	}
	const extent = Math.ceil(radius + 0.5);
	const grid = new KernelGrid(extent);
	const r2 = radius * radius;
	const halfDiagonal = Math.SQRT1_2;
	for (let y = -extent; y <= extent; y++) {
		for (let x = -extent; x <= extent; x++) {
			const centre = Math.hypot(x, y);
			if (centre + halfDiagonal <= radius) {
				grid.add(x, y, 1);
			} else if (centre - halfDiagonal < radius) {
				let inside = 0;
				for (let sy = 0; sy < SUPERSAMPLE; sy++) {
					const py = y - 0.5 + (sy + 0.5) / SUPERSAMPLE;
					for (let sx = 0; sx < SUPERSAMPLE; sx++) {
						const px = x - 0.5 + (sx + 0.5) / SUPERSAMPLE;
						if (px * px + py * py <= r2) inside++;
					}
				}
				if (inside > 0) grid.add(x, y, inside / (SUPERSAMPLE * SUPERSAMPLE));
			}
		}
	}
	return grid.toKernel();
}
