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
 * mirrored) reaches the blurred image. Each kernel row is split into runs of equal taps (zero runs
 * skipped); a run sums its input span from the row's prefix sums, so a disk or a box costs a few
 * operations per row instead of one per tap.
 */
export function convolveValid(x: Plane, k: Plane): Plane {
	const [h, w] = x.shape;
	const [kh, kw] = k.shape;
	const oh = h - kh + 1;
	const ow = w - kw + 1;
	if (oh < 1 || ow < 1) throw new RangeError(`image ${w}×${h} is smaller than kernel ${kw}×${kh}`);
	// prefix[r·(w + 1) + m] = Σ_{c < m} x(r, c), in double precision.
	const prefix = new Float64Array(h * (w + 1));
	for (let r = 0; r < h; r++) {
		for (let c = 0; c < w; c++) prefix[r * (w + 1) + c + 1] = prefix[r * (w + 1) + c] + x.data[r * w + c];
	}
	const acc = new Float64Array(oh * ow);
	for (let a = 0; a < kh; a++) {
		for (let b0 = 0; b0 < kw; ) {
			const weight = k.get(a, b0);
			let b1 = b0;
			while (b1 + 1 < kw && k.get(a, b1 + 1) === weight) b1++;
			if (weight !== 0) {
				// Σ_{b = b0…b1} x(r, j + kw−1−b) = P(j + kw − b0) − P(j + kw − 1 − b1).
				for (let i = 0; i < oh; i++) {
					const row = (i + kh - 1 - a) * (w + 1);
					const dst = i * ow;
					for (let j = 0; j < ow; j++) acc[dst + j] += weight * (prefix[row + j + kw - b0] - prefix[row + j + kw - 1 - b1]);
				}
			}
			b0 = b1 + 1;
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

/**
 * A street-sign-like scene, size×size in linear light: a flat background, a dark axis-aligned
 * panel with a light border, three rows of block letters at a regular pitch (strokes drawn from a
 * seeded set of bars), an arrow and a post. Its spectrum is strongly anisotropic: straight edges
 * draw bright axes through it and the letter pitch modulates them periodically, which is what a
 * straight-motion detector must not take for the dark lines of a blur. Edge pixels take the covered
 * share of each shape (area coverage, as a renderer's anti-aliasing gives).
 */
export function signScene(size: number, seed: number): Plane {
	const rand = seededRandom(seed);
	// Shapes in units of the frame (0–1), painted in order, later ones on top.
	const shapes: { x0: number; y0: number; x1: number; y1: number; level: number; head?: boolean }[] = [];
	const rect = (x0: number, y0: number, x1: number, y1: number, level: number) => shapes.push({ x0, y0, x1, y1, level });
	rect(0.075, 0.22, 0.925, 0.69, 0.8);
	rect(0.094, 0.239, 0.906, 0.671, 0.02);
	/** A row of `count` block letters of cell width `pitch`, glyph height `height`, stroke `stroke`. */
	const row = (count: number, pitch: number, top: number, height: number, stroke: number, level: number) => {
		const left = 0.5 - (count * pitch) / 2;
		for (let g = 0; g < count; g++) {
			const x0 = left + g * pitch + 0.12 * pitch;
			const x1 = left + (g + 1) * pitch - 0.12 * pitch;
			const bars = [
				() => rect(x0, top, x0 + stroke, top + height, level),
				() => rect(x1 - stroke, top, x1, top + height, level),
				() => rect((x0 + x1 - stroke) / 2, top, (x0 + x1 + stroke) / 2, top + height, level),
				() => rect(x0, top, x1, top + stroke, level),
				() => rect(x0, top + (height - stroke) / 2, x1, top + (height + stroke) / 2, level),
				() => rect(x0, top + height - stroke, x1, top + height, level)
			];
			let drawn = 0;
			for (const bar of bars) {
				if (rand() < 0.5) {
					bar();
					drawn++;
				}
			}
			if (drawn < 2) {
				bars[0]();
				bars[5]();
			}
		}
	};
	row(9, 0.085, 0.3, 0.1, 0.02, 0.85);
	row(14, 0.05, 0.46, 0.055, 0.01, 0.85);
	row(26, 0.028, 0.155, 0.03, 0.006, 0.03);
	rect(0.22, 0.595, 0.69, 0.625, 0.6);
	shapes.push({ x0: 0.69, y0: 0.555, x1: 0.78, y1: 0.665, level: 0.6, head: true });
	rect(0.47, 0.69, 0.53, 1, 0.1);

	const out = createPlane(size, size, new Float32Array(size * size).fill(0.2));
	const overlap = (a0: number, a1: number, p: number) => Math.max(0, Math.min(a1, p + 1) - Math.max(a0, p));
	for (const s of shapes) {
		const [x0, x1, y0, y1] = [s.x0 * size, s.x1 * size, s.y0 * size, s.y1 * size];
		for (let i = Math.floor(y0); i < Math.min(size, Math.ceil(y1)); i++) {
			for (let j = Math.floor(x0); j < Math.min(size, Math.ceil(x1)); j++) {
				let cover = overlap(x0, x1, j) * overlap(y0, y1, i);
				if (s.head) {
					// The arrow head, a triangle pointing right with the box's left side as its base: 4×4 samples.
					cover = 0;
					for (let a = 0; a < 4; a++) {
						for (let b = 0; b < 4; b++) {
							const x = j + (b + 0.5) / 4;
							const y = i + (a + 0.5) / 4;
							if (x >= x0 && x < x1 && Math.abs(y - (y0 + y1) / 2) <= ((y1 - y0) / 2) * (1 - (x - x0) / (x1 - x0))) cover += 1 / 16;
						}
					}
				}
				out.data[i * size + j] += cover * (s.level - out.data[i * size + j]);
			}
		}
	}
	return out;
}
