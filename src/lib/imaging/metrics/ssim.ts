import { planeValues, type Plane } from '../types';

/** Options of {@link ssim}; defaults are the paper's. */
export interface SsimOptions {
	/** Gaussian window side. @default 11 */
	windowSize?: number;
	/** Gaussian window standard deviation. @default 1.5 */
	sigma?: number;
	/** @default 0.01 */
	k1?: number;
	/** @default 0.03 */
	k2?: number;
	/** Dynamic range L of the values. @default 1 */
	dataRange?: number;
}

/**
 * Mean structural similarity (Wang et al.): for every window position (valid part only, as in the
 * authors' reference code),
 * SSIM = (2μₐμ_b + C1)(2σ_ab + C2) / ((μₐ² + μ_b² + C1)(σₐ² + σ_b² + C2)), C1 = (K1·L)², C2 = (K2·L)²,
 * with local statistics weighted by a normalised 11×11 Gaussian window of σ = 1.5.
 * @see Z. Wang, A. C. Bovik, H. R. Sheikh, E. P. Simoncelli, "Image quality assessment: from error
 *   visibility to structural similarity", IEEE Trans. Image Processing 13(4):600–612, 2004,
 *   doi:10.1109/TIP.2003.819861.
 * @throws RangeError for differing shapes, planes smaller than the window, or bad options.
 */
export function ssim(a: Plane, b: Plane, opts: SsimOptions = {}): number {
	const size = opts.windowSize ?? 11;
	const sigma = opts.sigma ?? 1.5;
	const k1 = opts.k1 ?? 0.01;
	const k2 = opts.k2 ?? 0.03;
	const range = opts.dataRange ?? 1;
	const [h, w] = a.shape;
	if (h !== b.shape[0] || w !== b.shape[1]) throw new RangeError(`planes differ in shape: ${a.shape.join('×')} vs ${b.shape.join('×')}`);
	if (!Number.isInteger(size) || size < 1 || size % 2 === 0) throw new RangeError(`windowSize must be a positive odd integer, got ${size}`);
	if (h < size || w < size) throw new RangeError(`planes of ${h}×${w} are smaller than the ${size}×${size} window`);
	if (!(sigma > 0) || !(range > 0) || !(k1 >= 0) || !(k2 >= 0)) throw new RangeError('sigma and dataRange must be positive, k1 and k2 non-negative');
	const g = new Float64Array(size);
	let total = 0;
	for (let i = 0; i < size; i++) {
		const d = i - (size - 1) / 2;
		g[i] = Math.exp(-(d * d) / (2 * sigma * sigma));
		total += g[i];
	}
	for (let i = 0; i < size; i++) g[i] /= total;
	const x = planeValues(a);
	const y = planeValues(b);
	const n = h * w;
	const xx = new Float64Array(n);
	const yy = new Float64Array(n);
	const xy = new Float64Array(n);
	for (let i = 0; i < n; i++) {
		xx[i] = x[i] * x[i];
		yy[i] = y[i] * y[i];
		xy[i] = x[i] * y[i];
	}
	const oh = h - size + 1;
	const ow = w - size + 1;
	const mx = filterValid(x, h, w, g);
	const my = filterValid(y, h, w, g);
	const sxx = filterValid(xx, h, w, g);
	const syy = filterValid(yy, h, w, g);
	const sxy = filterValid(xy, h, w, g);
	const c1 = (k1 * range) ** 2;
	const c2 = (k2 * range) ** 2;
	let sum = 0;
	for (let i = 0; i < oh * ow; i++) {
		const mux = mx[i];
		const muy = my[i];
		const vx = sxx[i] - mux * mux;
		const vy = syy[i] - muy * muy;
		const cxy = sxy[i] - mux * muy;
		sum += ((2 * mux * muy + c1) * (2 * cxy + c2)) / ((mux * mux + muy * muy + c1) * (vx + vy + c2));
	}
	return sum / (oh * ow);
}

/** Separable 'valid' filtering with a symmetric 1-D window (rows, then columns). */
function filterValid(src: ArrayLike<number>, h: number, w: number, g: Float64Array): Float64Array {
	const size = g.length;
	const ow = w - size + 1;
	const oh = h - size + 1;
	const tmp = new Float64Array(h * ow);
	for (let i = 0; i < h; i++) {
		for (let j = 0; j < ow; j++) {
			let s = 0;
			for (let t = 0; t < size; t++) s += g[t] * src[i * w + j + t];
			tmp[i * ow + j] = s;
		}
	}
	const out = new Float64Array(oh * ow);
	for (let i = 0; i < oh; i++) {
		for (let j = 0; j < ow; j++) {
			let s = 0;
			for (let t = 0; t < size; t++) s += g[t] * tmp[(i + t) * ow + j];
			out[i * ow + j] = s;
		}
	}
	return out;
}
