import { estimateNoiseSigma } from '../analysis/noise';
import { planeValues, type Plane } from '../types';

/**
 * Pixels kept as "not an edge": squared Sobel magnitude below GRADIENT_QUANTILE·12·σ². For white
 * noise gx and gy are independent N(0, 12σ²) (the Sobel taps' squares sum to 12), so |∇|²/(12σ²) is
 * χ² with 2 degrees of freedom and 6 keeps 1 − e^−3 ≈ 95 % of pure-noise pixels. A statistical
 * choice of this module, not taken from Tai & Yang (who keep a fixed share of the gradient histogram).
 */
const GRADIENT_QUANTILE = 6;
/** Fewest kept pixels for the edge-masked reading; below it the plain Immerkær reading is used. */
const MIN_KEPT = 1000;
const MAX_ROUNDS = 20;

/** Median of |N(0, 1)|, Φ⁻¹(3/4) = 0.6745 (Donoho & Johnstone 1994). */
const MAD_TO_SIGMA = 0.6745;

/** k-th smallest value of an array (Hoare's selection, average O(n)); reorders the array. */
function select(values: Float32Array, k: number): number {
	let lo = 0;
	let hi = values.length - 1;
	while (lo < hi) {
		const pivot = values[(lo + hi) >> 1];
		let i = lo;
		let j = hi;
		while (i <= j) {
			while (values[i] < pivot) i++;
			while (values[j] > pivot) j--;
			if (i <= j) {
				const t = values[i];
				values[i] = values[j];
				values[j] = t;
				i++;
				j--;
			}
		}
		if (k <= j) hi = j;
		else if (k >= i) lo = i;
		else return values[k];
	}
	return values[k];
}

/**
 * Noise standard deviation from the finest diagonal wavelet band:
 * σ = median(|HH1|) / 0.6745, with HH1 the orthonormal Haar diagonal detail of each 2×2 block,
 * (a − b − c + d) / 2 for the block [[a, b], [c, d]] (white noise of variance σ² keeps variance σ²).
 * The median ignores the few large coefficients that edges leave in the band.
 * @see D. L. Donoho, I. M. Johnstone, "Ideal spatial adaptation by wavelet shrinkage", Biometrika
 *   81(3):425–455, 1994, doi:10.1093/biomet/81.3.425 (DOI from memory).
 * @throws RangeError when the plane is smaller than 2×2.
 */
export function estimateNoiseMad(plane: Plane): number {
	const [height, width] = plane.shape;
	if (height < 2 || width < 2) throw new RangeError(`wavelet noise estimate needs at least 2×2 pixels, got ${width}×${height}`);
	const d = planeValues(plane);
	const rows = height >> 1;
	const cols = width >> 1;
	const detail = new Float32Array(rows * cols);
	for (let i = 0; i < rows; i++) {
		const top = 2 * i * width;
		const bottom = top + width;
		for (let j = 0; j < cols; j++) {
			const x = 2 * j;
			detail[i * cols + j] = Math.abs(d[top + x] - d[top + x + 1] - d[bottom + x] + d[bottom + x + 1]) / 2;
		}
	}
	const n = detail.length;
	// Median of an even count: mean of the two middle values.
	const upper = select(detail, n >> 1);
	const median = n % 2 === 1 ? upper : (upper + select(detail, (n >> 1) - 1)) / 2;
	return median / MAD_TO_SIGMA;
}

/**
 * Immerkær's noise σ measured only where the image has no edge, so that image structure does not
 * read as noise on edge-rich scenes at low noise.
 * 1. At every interior pixel: the Immerkær response L = I ∗ M, M = [[1, −2, 1], [−2, 4, −2], [1, −2, 1]]
 *    (white noise: L ~ N(0, 36σ²)), and the squared Sobel gradient G = gx² + gy².
 * 2. Starting from Immerkær's σ over all pixels (structure only raises it), repeat: keep the pixels
 *    with G < 6·12·σ² (see GRADIENT_QUANTILE) and set σ = median|L| / (6 · 0.6745) over them, until σ
 *    changes by less than 0.1 %.
 * Why the mask adds no bias: M is even and the Sobel taps are odd about the centre, so on white
 * Gaussian noise L is uncorrelated with, hence independent of, (gx, gy); selecting pixels by G leaves
 * the distribution of L unchanged. The median (Donoho & Johnstone's robust scale, 0.6745 = Φ⁻¹(3/4))
 * replaces Immerkær's mean |L| so that the few structured pixels left in the mask do not pull σ up.
 * Falls back to Immerkær's plain reading when fewer than 1000 pixels are kept (dense texture, tiny
 * or flat planes).
 * @see J. Immerkær, "Fast Noise Variance Estimation", CVIU 64(2):300–302, 1996,
 *   doi:10.1006/cviu.1996.0060 (the mask, and excluding edges as a remedy); S.-C. Tai, S.-M. Yang,
 *   "A fast method for image noise estimation using Laplacian operator and adaptive edge detection",
 *   Proc. 3rd ISCCSP, Malta, 2008, pp. 1077–1081 (Sobel edge mask before Immerkær's operator; no DOI
 *   checked); Donoho & Johnstone 1994 (see estimateNoiseMad).
 * @throws RangeError when the plane is smaller than 3×3.
 */
export function estimateNoiseEdgeMasked(plane: Plane): number {
	const [height, width] = plane.shape;
	const plain = estimateNoiseSigma(plane);
	const d = planeValues(plane);
	const count = (height - 2) * (width - 2);
	const response = new Float32Array(count);
	const gradient = new Float32Array(count);
	let k = 0;
	for (let i = 1; i < height - 1; i++) {
		const up = (i - 1) * width;
		const mid = i * width;
		const down = (i + 1) * width;
		for (let j = 1; j < width - 1; j++, k++) {
			const a = d[up + j - 1], b = d[up + j], c = d[up + j + 1];
			const e = d[mid + j - 1], f = d[mid + j], g = d[mid + j + 1];
			const p = d[down + j - 1], q = d[down + j], r = d[down + j + 1];
			response[k] = Math.abs(a - 2 * b + c - 2 * (e - 2 * f + g) + p - 2 * q + r);
			const gx = c + 2 * g + r - (a + 2 * e + p);
			const gy = p + 2 * q + r - (a + 2 * b + c);
			gradient[k] = gx * gx + gy * gy;
		}
	}
	const kept = new Float32Array(count);
	let sigma = plain;
	for (let round = 0; round < MAX_ROUNDS && sigma > 0; round++) {
		const limit = GRADIENT_QUANTILE * 12 * sigma * sigma;
		let n = 0;
		for (let m = 0; m < count; m++) if (gradient[m] < limit) kept[n++] = response[m];
		if (n < MIN_KEPT) return plain;
		const values = kept.subarray(0, n);
		const next = select(values, n >> 1) / (6 * MAD_TO_SIGMA);
		const settled = Math.abs(next - sigma) <= 1e-3 * sigma;
		sigma = next;
		if (settled) break;
	}
	return sigma;
}

/** Noise readings of a region and the Wiener noise-to-signal ratio they imply. */
export interface NoiseEstimate {
	/** Immerkær's σ on the pixels without edges (estimateNoiseEdgeMasked); null below 3×3 pixels. */
	immerkaer: number | null;
	/** Donoho & Johnstone's wavelet MAD σ, a second opinion; null below 2×2 pixels. */
	mad: number | null;
	/**
	 * Constant Wiener NSR = σ² / (var(g) − σ²) with σ = min(immerkaer, mad) and var(g) the region's
	 * variance; null when the region is too small, noise-free, or the noise explains all its variance.
	 */
	nsr: number | null;
	/** The σ the NSR and the spectral noise floor use: the smaller reading (see estimateNoise). */
	sigma: number | null;
}

/**
 * Both noise estimates of a plane and the constant noise-to-signal ratio of the Wiener filter
 * X̂ = H*·Y / (|H|² + NSR): for white noise the noise power spectrum is σ² at every frequency and
 * the mean signal power spectrum is the signal's variance, var(f) = var(g) − σ² (noise independent
 * of the scene), so NSR = σ² / (var(g) − σ²), the same rule as the engine's automatic Wiener
 * setting. σ is the smaller of the two readings: for Gaussian noise both are unbiased on smooth
 * content and both are pushed up, never down, by fine image structure (edges, texture), so the
 * smaller is the less contaminated. The Immerkær reading skips edge pixels (estimateNoiseEdgeMasked). Values are in the plane's units (the route feeds linear-light
 * luminance).
 * @see J. Immerkær, "Fast Noise Variance Estimation", CVIU 64(2):300–302, 1996,
 *   doi:10.1006/cviu.1996.0060; Tai & Yang 2008 (see estimateNoiseEdgeMasked); Donoho & Johnstone
 *   1994 (see estimateNoiseMad); Gonzalez & Woods,
 *   Digital Image Processing, 4th ed., 2018, §5.8 (NSR as the ratio of noise to signal power).
 * Never throws on small planes: the readings that need more pixels are null.
 */
export function estimateNoise(plane: Plane): NoiseEstimate {
	const [height, width] = plane.shape;
	const immerkaer = height >= 3 && width >= 3 ? estimateNoiseEdgeMasked(plane) : null;
	const mad = height >= 2 && width >= 2 ? estimateNoiseMad(plane) : null;
	const readings = [immerkaer, mad].filter((v): v is number => v !== null);
	const sigma = readings.length > 0 ? Math.min(...readings) : null;
	let nsr: number | null = null;
	if (sigma !== null) {
		const d = planeValues(plane);
		let sum = 0;
		let sumSq = 0;
		for (let i = 0; i < d.length; i++) {
			sum += d[i];
			sumSq += d[i] * d[i];
		}
		const mean = sum / d.length;
		const signal = sumSq / d.length - mean * mean - sigma * sigma;
		if (signal > 0 && sigma > 0) nsr = (sigma * sigma) / signal;
	}
	return { immerkaer, mad, nsr, sigma };
}
