import { planeValues, type Plane } from '../types';
import { KERNEL_LIMITS, type KernelSpec } from './spec';
import { finishKernel } from './raster';

/** Options of {@link kernelFromImage}. */
export interface KernelFromImageOptions {
	/** Values below this fraction of the maximum are set to zero (noise floor of a measured PSF). @default 0 */
	relativeThreshold?: number;
	/** Recorded origin of the values. @default 'upload' */
	origin?: 'upload' | 'streak';
}

/**
 * Centre explicit non-negative kernel values: crop to the bounding box of the non-zero values, place
 * the pixel nearest the centroid at the centre of an odd-sized grid (integer shift only, so measured
 * values are not resampled: the centroid ends within half a pixel of the centre), and normalise to
 * sum 1 ("common practice, no source"; the normalisation is the flux-conservation requirement of a
 * PSF, Richardson 1972).
 * @throws RangeError for negative or non-finite values, zero sum, or a centred kernel larger than 257.
 */
export function centreExplicitKernel(values: ArrayLike<number>, height: number, width: number): Plane {
	if (values.length !== height * width) throw new RangeError(`kernel needs ${height * width} values, got ${values.length}`);
	let sum = 0;
	let sx = 0;
	let sy = 0;
	let top = height;
	let bottom = -1;
	let left = width;
	let right = -1;
	for (let i = 0; i < height; i++) {
		for (let j = 0; j < width; j++) {
			const v = values[i * width + j];
			if (!Number.isFinite(v) || v < 0) throw new RangeError(`kernel values must be finite and non-negative, got ${v} at (${j}, ${i})`);
			if (v > 0) {
				sum += v;
				sx += v * j;
				sy += v * i;
				top = Math.min(top, i);
				bottom = Math.max(bottom, i);
				left = Math.min(left, j);
				right = Math.max(right, j);
			}
		}
	}
	if (!(sum > 0)) throw new RangeError('kernel values must have a positive sum');
	const ci = Math.round(sy / sum);
	const cj = Math.round(sx / sum);
	const ri = Math.max(ci - top, bottom - ci);
	const rj = Math.max(cj - left, right - cj);
	const h = 2 * ri + 1;
	const w = 2 * rj + 1;
	if (h > KERNEL_LIMITS.maxImageSide || w > KERNEL_LIMITS.maxImageSide) {
		throw new RangeError(`centred kernel would be ${w}×${h}, above the limit of ${KERNEL_LIMITS.maxImageSide}`);
	}
	const out = new Float64Array(h * w);
	for (let i = top; i <= bottom; i++) {
		for (let j = left; j <= right; j++) out[(i - ci + ri) * w + (j - cj + rj)] = values[i * width + j];
	}
	return finishKernel(out, h, w);
}

/**
 * Turn an uploaded PSF image (e.g. a photographed point source, any size) into an `image` kernel
 * spec: optional noise floor, crop, centre on the centroid, normalise by the sum.
 * @throws RangeError for a threshold outside [0, 1) or unusable values (see centreExplicitKernel).
 */
export function kernelFromImage(values: Plane, opts: KernelFromImageOptions = {}): Extract<KernelSpec, { kind: 'image' }> {
	const threshold = opts.relativeThreshold ?? 0;
	if (!(threshold >= 0 && threshold < 1)) throw new RangeError(`relativeThreshold must lie in [0, 1), got ${threshold}`);
	const [height, width] = values.shape;
	const src = planeValues(values);
	let max = 0;
	for (let i = 0; i < src.length; i++) {
		if (!Number.isFinite(src[i]) || src[i] < 0) throw new RangeError(`PSF image values must be finite and non-negative, got ${src[i]}`);
		max = Math.max(max, src[i]);
	}
	const floor = threshold * max;
	const kept = Array.from(src, (v) => (v >= floor ? v : 0));
	const kernel = centreExplicitKernel(kept, height, width);
	const [h, w] = kernel.shape;
	return { kind: 'image', width: w, height: h, data: Array.from(kernel.data), origin: opts.origin ?? 'upload' };
}
