import { createPlane, planeValues, type Plane } from '../types';
import { kernelFromImage } from './explicit';
import type { KernelSpec } from './spec';

/** Options of {@link kernelFromStreak}. */
export interface KernelFromStreakOptions {
	/** Percentile of the crop taken as the background level. @default 50 (the median) */
	backgroundPercentile?: number;
	/** Values less than this many robust noise deviations above the background become zero. @default 3 */
	thresholdSigmas?: number;
}

/**
 * PSF from a crop around the streak a point light left in a blurred photograph (use linear-light
 * values). Background = the chosen percentile of the crop; noise σ = 1.4826 · median absolute
 * deviation from it (a robust Gaussian σ estimate: P. J. Rousseeuw, C. Croux, "Alternatives to the
 * Median Absolute Deviation", J. American Statistical Association 88(424):1273–1283, 1993,
 * doi:10.1080/01621459.1993.10476408); values ≤ background + k·σ become zero, the rest keep their
 * excess over the background; then the kernel is centred and normalised like an uploaded PSF.
 * @throws RangeError for a rectangle outside the plane, bad options, or a crop with no streak.
 */
export function kernelFromStreak(
	plane: Plane,
	rect: { x: number; y: number; width: number; height: number },
	opts: KernelFromStreakOptions = {}
): Extract<KernelSpec, { kind: 'image' }> {
	const [height, width] = plane.shape;
	const { x, y } = rect;
	if (![x, y, rect.width, rect.height].every(Number.isInteger) || rect.width < 1 || rect.height < 1) {
		throw new RangeError('streak rectangle needs integer x, y and positive integer width, height');
	}
	if (x < 0 || y < 0 || x + rect.width > width || y + rect.height > height) {
		throw new RangeError(`streak rectangle ${rect.width}×${rect.height} at (${x}, ${y}) leaves the ${width}×${height} image`);
	}
	const percentile = opts.backgroundPercentile ?? 50;
	const k = opts.thresholdSigmas ?? 3;
	if (!(percentile >= 0 && percentile <= 100)) throw new RangeError(`backgroundPercentile must lie in [0, 100], got ${percentile}`);
	if (!(k >= 0 && Number.isFinite(k))) throw new RangeError(`thresholdSigmas must be finite and non-negative, got ${k}`);
	const src = planeValues(plane);
	const crop = new Float64Array(rect.width * rect.height);
	for (let i = 0; i < rect.height; i++) {
		for (let j = 0; j < rect.width; j++) crop[i * rect.width + j] = src[(y + i) * width + x + j];
	}
	const background = quantile(crop, percentile / 100);
	const deviations = crop.map((v) => Math.abs(v - background));
	const sigma = 1.4826 * quantile(deviations, 0.5);
	const floor = background + k * sigma;
	const excess = crop.map((v) => (v > floor ? v - background : 0));
	if (!excess.some((v) => v > 0)) throw new RangeError('no streak above the background was found in the rectangle');
	return kernelFromImage(createPlane(rect.height, rect.width, Float32Array.from(excess)), { origin: 'streak' });
}

/** Linear-interpolated quantile q ∈ [0, 1] of the values (definition 7 of R. J. Hyndman, Y. Fan, "Sample Quantiles in Statistical Packages",
 * The American Statistician 50(4):361–365, 1996, doi:10.1080/00031305.1996.10473566). */
function quantile(values: Float64Array, q: number): number {
	const sorted = Float64Array.from(values).sort();
	const pos = q * (sorted.length - 1);
	const lo = Math.floor(pos);
	const hi = Math.min(sorted.length - 1, lo + 1);
	return sorted[lo] + (pos - lo) * (sorted[hi] - sorted[lo]);
}
