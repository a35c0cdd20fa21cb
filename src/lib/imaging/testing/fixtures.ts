import { createPlane, type Plane } from '../types';

export { seededGaussian, seededRandom } from '../random';
import { seededGaussian, seededRandom } from '../random';

/**
 * A sharp synthetic test scene in [0.05, 0.95]: overlapping rectangles and discs of random grey
 * levels on a gentle gradient, plus fine stripes, so it has edges at many orientations.
 */
export function syntheticScene(height: number, width: number, seed = 1): Plane {
	const rand = seededRandom(seed);
	const out = createPlane(height, width);
	const d = out.data;
	for (let i = 0; i < height; i++) for (let j = 0; j < width; j++) d[i * width + j] = 0.3 + 0.2 * (i / height) + 0.1 * (j / width);
	for (let s = 0; s < 24; s++) {
		const level = 0.05 + 0.9 * rand();
		const cy = rand() * height;
		const cx = rand() * width;
		const r = 3 + rand() * Math.min(height, width) * 0.2;
		const disc = rand() < 0.5;
		for (let i = Math.max(0, Math.floor(cy - r)); i < Math.min(height, Math.ceil(cy + r)); i++) {
			for (let j = Math.max(0, Math.floor(cx - r)); j < Math.min(width, Math.ceil(cx + r)); j++) {
				if (!disc || (i - cy) ** 2 + (j - cx) ** 2 <= r * r) d[i * width + j] = level;
			}
		}
	}
	for (let i = Math.floor(height * 0.7); i < Math.floor(height * 0.8); i++) {
		for (let j = 0; j < width; j++) if ((j >> 1) % 2 === 0) d[i * width + j] = 0.9;
	}
	return out;
}

/** Direct (naive) linear convolution, 'valid' part: out[i,j] = Σ k[a,b]·x[i + kh−1−a, j + kw−1−b]. */
export function convolveValidNaive(x: Plane, k: Plane): Plane {
	const [h, w] = x.shape;
	const [kh, kw] = k.shape;
	const out = createPlane(h - kh + 1, w - kw + 1);
	for (let i = 0; i < h - kh + 1; i++) {
		for (let j = 0; j < w - kw + 1; j++) {
			let s = 0;
			for (let a = 0; a < kh; a++) for (let b = 0; b < kw; b++) s += k.get(a, b) * x.get(i + kh - 1 - a, j + kw - 1 - b);
			out.data[i * (w - kw + 1) + j] = s;
		}
	}
	return out;
}

/** Direct circular convolution with a centred kernel. */
export function convolveCircularNaive(x: Plane, k: Plane): Plane {
	const [h, w] = x.shape;
	const [kh, kw] = k.shape;
	const ca = (kh - 1) >> 1;
	const cb = (kw - 1) >> 1;
	const out = createPlane(h, w);
	for (let i = 0; i < h; i++) {
		for (let j = 0; j < w; j++) {
			let s = 0;
			for (let a = 0; a < kh; a++) {
				for (let b = 0; b < kw; b++) s += k.get(a, b) * x.get((((i + ca - a) % h) + h) % h, (((j + cb - b) % w) + w) % w);
			}
			out.data[i * w + j] = s;
		}
	}
	return out;
}

/** Add seeded Gaussian noise of standard deviation sigma (new plane). */
export function withNoise(x: Plane, sigma: number, seed = 7): Plane {
	const g = seededGaussian(seed);
	const out = createPlane(x.shape[0], x.shape[1]);
	for (let i = 0; i < out.data.length; i++) out.data[i] = x.data[i] + sigma * g();
	return out;
}

/** Central crop (a view copied to a contiguous plane). */
export function crop(x: Plane, top: number, left: number, height: number, width: number): Plane {
	const out = createPlane(height, width);
	for (let i = 0; i < height; i++) for (let j = 0; j < width; j++) out.data[i * width + j] = x.get(top + i, left + j);
	return out;
}
