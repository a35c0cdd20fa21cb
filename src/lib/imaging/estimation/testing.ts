/**
 * Synthetic inputs for the estimation tests and benchmark, written apart from the estimators so
 * that they do not grade themselves: a seeded natural-statistics scene, a plain spatial convolution
 * and seeded Gaussian noise.
 */
import { seededGaussian, seededRandom } from '../testing/fixtures';
import { createPlane, type Plane } from '../types';

/**
 * "Dead leaves" scene: opaque discs of random grey dropped one over another, radii drawn with
 * density ∝ 1/r³ between rMin and rMax, until the frame is covered. Such occlusion images have
 * the scale-invariant ~1/ρ² power spectrum of natural photographs, which the blur estimators
 * rely on.
 * @see A. B. Lee, D. Mumford, J. Huang, "Occlusion models for natural images: a statistical study
 *   of a scale-invariant dead leaves model", Int. J. Computer Vision 41:35–59, 2001,
 *   doi:10.1023/A:1011109015675 (DOI from memory).
 */
export function deadLeaves(height: number, width: number, seed: number, rMin = 2, rMax = 60): Plane {
	const rand = seededRandom(seed);
	const out = createPlane(height, width);
	const covered = new Uint8Array(height * width);
	let remaining = height * width;
	// Discs are drawn front to back: a pixel takes the first disc that covers it.
	for (let drop = 0; remaining > 0 && drop < 200_000; drop++) {
		// Inverse CDF of p(r) ∝ r^−3 on [rMin, rMax].
		const a = rMin ** -2;
		const b = rMax ** -2;
		const r = (a - rand() * (a - b)) ** -0.5;
		const cx = rand() * (width + 2 * r) - r;
		const cy = rand() * (height + 2 * r) - r;
		const level = 0.1 + 0.8 * rand();
		for (let i = Math.max(0, Math.ceil(cy - r)); i <= Math.min(height - 1, Math.floor(cy + r)); i++) {
			for (let j = Math.max(0, Math.ceil(cx - r)); j <= Math.min(width - 1, Math.floor(cx + r)); j++) {
				const p = i * width + j;
				if (covered[p] || (i - cy) ** 2 + (j - cx) ** 2 > r * r) continue;
				covered[p] = 1;
				out.data[p] = level;
				remaining--;
			}
		}
	}
	return out;
}

/**
 * 'Valid' 2-D convolution in double precision, out(i, j) = Σ k(a, b)·x(i + kh−1−a, j + kw−1−b):
 * only outputs whose kernel footprint lies inside the input, so no boundary assumption (circular,
 * mirrored) reaches the blurred image. Zero taps are skipped.
 */
export function convolveValid(x: Plane, k: Plane): Plane {
	const [h, w] = x.shape;
	const [kh, kw] = k.shape;
	const oh = h - kh + 1;
	const ow = w - kw + 1;
	if (oh < 1 || ow < 1) throw new RangeError(`image ${w}×${h} is smaller than kernel ${kw}×${kh}`);
	const acc = new Float64Array(oh * ow);
	for (let a = 0; a < kh; a++) {
		for (let b = 0; b < kw; b++) {
			const weight = k.get(a, b);
			if (weight === 0) continue;
			for (let i = 0; i < oh; i++) {
				const src = (i + kh - 1 - a) * w + (kw - 1 - b);
				const dst = i * ow;
				for (let j = 0; j < ow; j++) acc[dst + j] += weight * x.data[src + j];
			}
		}
	}
	return createPlane(oh, ow, Float32Array.from(acc));
}

/** The centre size×size crop of a plane, copied. */
export function centreCrop(x: Plane, size: number): Plane {
	const [h, w] = x.shape;
	if (size > h || size > w) throw new RangeError(`crop ${size} exceeds ${w}×${h}`);
	const top = (h - size) >> 1;
	const left = (w - size) >> 1;
	const out = createPlane(size, size);
	for (let i = 0; i < size; i++) out.data.set(x.data.subarray((top + i) * w + left, (top + i) * w + left + size), i * size);
	return out;
}

/** A copy of the plane plus seeded white Gaussian noise of standard deviation sigma. */
export function addNoise(x: Plane, sigma: number, seed: number): Plane {
	const g = seededGaussian(seed);
	const out = createPlane(x.shape[0], x.shape[1]);
	for (let i = 0; i < out.data.length; i++) out.data[i] = x.data[i] + sigma * g();
	return out;
}

/** Blur a dead-leaves scene with `kernel` (valid part only), crop its centre to `size` and add noise. */
export function blurredScene(kernel: Plane, size: number, noiseSigma: number, seed: number): Plane {
	const margin = Math.max(kernel.shape[0], kernel.shape[1]);
	const sharp = deadLeaves(size + margin, size + margin, seed);
	return addNoise(centreCrop(convolveValid(sharp, kernel), size), noiseSigma, seed + 1);
}
