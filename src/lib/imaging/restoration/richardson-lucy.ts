import type { FftBackend } from '../fft/backend';
import { defaultFftBackend } from '../fft/default-backend';
import { createPlane, planeValues, type Plane } from '../types';
import { chooseBlockSize, convolve, kernelBlockSpectrum, type ConvolutionJob } from './block-convolution';
import { edgeTaper } from './edge-taper';
import { tvDivergence } from './total-variation';

/** Options of {@link richardsonLucy}. */
export interface RichardsonLucyOptions {
	/** Maximum number of iterations. @default 30 */
	iterations?: number;
	/** Biggs–Andrews vector extrapolation. @default true */
	accelerate?: boolean;
	/** RL-TV regularisation weight λ (0 = plain RL); must stay below 0.25 so 1 − λ·div > 0. @default 0 */
	tv?: number;
	/** Stop when ‖x_k − x_{k−1}‖ / ‖x_{k−1}‖ falls below this (0: run all iterations). @default 1e-4 */
	relativeChange?: number;
	/**
	 * 'extended': unknown image on a domain one kernel larger than the photo, data term on the observed
	 * pixels only (Bertero & Boccacci 2005); 'taper': edge-tapered photo, periodic model;
	 * 'circular': periodic model. @default 'extended'
	 */
	boundary?: 'extended' | 'taper' | 'circular';
	/** Starting estimate on the photo's grid (clamped positive); @default flat at the photo's mean */
	initial?: Plane;
	fft?: FftBackend;
	/** Called after every iteration with (done, planned). */
	onProgress?: (done: number, total: number) => void;
	/** Checked before every iteration; an aborted signal throws its reason. */
	signal?: AbortSignal;
}

export interface RichardsonLucyResult {
	plane: Plane;
	iterationsRun: number;
	/** True when the relative-change rule ended the run before `iterations`. */
	stoppedEarly: boolean;
}

/** Weights Hᵀ1 below this are treated as unobserved: the estimate there is set to 0 (Bertero & Boccacci 2005, §3). */
const MIN_WEIGHT = 1e-4;
/** Model values below this do not divide the data (avoids 0/0 on black regions). */
const MIN_MODEL = 1e-12;
/** Starting values are kept at least this fraction of the mean: RL cannot revive an exact zero. */
const MIN_START = 1e-3;

/**
 * Richardson–Lucy deconvolution, x_{k+1} = x_k / Hᵀ1 · Hᵀ(y / H x_k), which keeps x ≥ 0 and
 * conserves flux (Σ Hᵀ1·x_{k+1} = Σ y).
 * - Acceleration: x_k is first extrapolated along the last step, y_k = x_k + α(x_k − x_{k−1}),
 *   α = Σ g_{k−1}·g_{k−2} / Σ g_{k−2}², clamped to [0, 1), g the last RL corrections.
 * - RL-TV: the divisor becomes Hᵀ1 − λ·div(∇x/|∇x|).
 * - Extended boundary: x lives on (H + kh − 1) × (W + kw − 1), H is the 'valid' convolution onto
 *   the observed pixels, so no periodicity or padding is assumed.
 * Convolutions run block-wise (overlap-save) with the kernel's block spectrum computed once.
 * @see W. H. Richardson, "Bayesian-Based Iterative Method of Image Restoration", JOSA 62(1):55–59,
 *   1972, doi:10.1364/JOSA.62.000055; L. B. Lucy, "An iterative technique for the rectification of
 *   observed distributions", Astronomical Journal 79:745–754, 1974, doi:10.1086/111605;
 *   D. S. C. Biggs, M. Andrews, "Acceleration of iterative image restoration algorithms", Applied
 *   Optics 36(8):1766–1775, 1997, doi:10.1364/AO.36.001766; N. Dey et al., Microscopy Research and
 *   Technique 69(4):260–266, 2006, doi:10.1002/jemt.20294; M. Bertero, P. Boccacci, "A simple method
 *   for the reduction of boundary effects in the Richardson-Lucy approach to image deconvolution",
 *   Astronomy & Astrophysics 437:369–374, 2005, doi:10.1051/0004-6361:20052717.
 * @throws RangeError for bad options, negative input values, or an image smaller than the kernel.
 */
export function richardsonLucy(plane: Plane, psf: Plane, opts: RichardsonLucyOptions = {}): RichardsonLucyResult {
	const iterations = opts.iterations ?? 30;
	const accelerate = opts.accelerate ?? true;
	const lambda = opts.tv ?? 0;
	const tolerance = opts.relativeChange ?? 1e-4;
	const boundary = opts.boundary ?? 'extended';
	const backend = opts.fft ?? defaultFftBackend();
	if (!Number.isInteger(iterations) || iterations < 0 || iterations > 10000) throw new RangeError(`iterations must be an integer in [0, 10000], got ${iterations}`);
	if (!(lambda >= 0 && lambda < 0.25)) throw new RangeError(`tv must lie in [0, 0.25), got ${lambda}`);
	if (!(tolerance >= 0) || !Number.isFinite(tolerance)) throw new RangeError(`relativeChange must be finite and ≥ 0, got ${tolerance}`);
	if (boundary !== 'extended' && boundary !== 'taper' && boundary !== 'circular') throw new RangeError(`unknown boundary ${String(boundary)}`);
	const [h, w] = plane.shape;
	const [kh, kw] = psf.shape;
	if (h < kh || w < kw) throw new RangeError(`image ${w}×${h} is smaller than the kernel ${kw}×${kh}`);
	if (opts.initial && (opts.initial.shape[0] !== h || opts.initial.shape[1] !== w)) throw new RangeError('initial estimate must have the image size');
	const observed = planeValues(plane);
	for (let i = 0; i < observed.length; i++) {
		if (!(observed[i] >= 0)) throw new RangeError(`Richardson–Lucy needs non-negative finite data, got ${observed[i]} at index ${i}`);
	}

	const extended = boundary === 'extended';
	const er = extended ? h + kh - 1 : h;
	const ec = extended ? w + kw - 1 : w;
	const top = extended ? (kh - 1) >> 1 : 0;
	const left = extended ? (kw - 1) >> 1 : 0;
	const alloc = (n: number) => backend.parallel?.allocate(n) ?? new Float32Array(n);

	const data = alloc(h * w);
	data.set(boundary === 'taper' ? Float32Array.from(edgeTaper(observed, h, w, psf, backend)) : observed);

	const kernel = new Float64Array(kh * kw);
	const flipped = new Float64Array(kh * kw);
	for (let a = 0; a < kh; a++) {
		for (let b = 0; b < kw; b++) {
			kernel[a * kw + b] = psf.get(a, b);
			flipped[(kh - 1 - a) * kw + (kw - 1 - b)] = psf.get(a, b);
		}
	}
	const estimate = alloc(er * ec);
	const model = alloc(h * w);
	const correction = alloc(er * ec);
	const offset = extended ? 0 : -((kh - 1) >> 1);
	const offsetCols = extended ? 0 : -((kw - 1) >> 1);
	const forward: ConvolutionJob = {
		src: estimate, srcRows: er, srcCols: ec, out: model, outRows: h, outCols: w,
		rowOffset: offset, colOffset: offsetCols, kernel, kernelRows: kh, kernelCols: kw,
		outside: extended ? 'zero' : 'wrap', blockSize: chooseBlockSize(kh, kw, h, w)
	};
	const adjoint: ConvolutionJob = {
		src: model, srcRows: h, srcCols: w, out: correction, outRows: er, outCols: ec,
		rowOffset: extended ? -(kh - 1) : offset, colOffset: extended ? -(kw - 1) : offsetCols,
		kernel: flipped, kernelRows: kh, kernelCols: kw,
		outside: extended ? 'zero' : 'wrap', blockSize: chooseBlockSize(kh, kw, er, ec)
	};
	const forwardSpectrum = backend.parallel ? undefined : kernelBlockSpectrum(forward, backend);
	const adjointSpectrum = backend.parallel ? undefined : kernelBlockSpectrum(adjoint, backend);

	// Hᵀ1: the share of each unknown pixel's light that reaches the observed frame.
	const weights = new Float32Array(er * ec);
	model.fill(1);
	convolve(adjoint, backend, adjointSpectrum);
	weights.set(correction);

	initialise(estimate, er, ec, top, left, data, h, w, opts.initial);
	for (let p = 0; p < estimate.length; p++) if (weights[p] < MIN_WEIGHT) estimate[p] = 0;

	const previous = accelerate ? new Float32Array(er * ec) : undefined;
	const step = accelerate ? new Float32Array(er * ec) : undefined;
	const lastStep = accelerate ? new Float32Array(er * ec) : undefined;
	const current = new Float32Array(er * ec);
	const divergence = lambda > 0 ? new Float32Array(er * ec) : undefined;
	const gx = lambda > 0 ? new Float32Array(er * ec) : undefined;
	const gy = lambda > 0 ? new Float32Array(er * ec) : undefined;

	let iterationsRun = 0;
	let stoppedEarly = false;
	for (let k = 0; k < iterations; k++) {
		opts.signal?.throwIfAborted();
		current.set(estimate);
		if (accelerate && previous && step && lastStep && k >= 2) {
			let num = 0;
			let den = 0;
			for (let p = 0; p < step.length; p++) {
				num += step[p] * lastStep[p];
				den += lastStep[p] * lastStep[p];
			}
			const alpha = den > 0 ? Math.min(Math.max(num / den, 0), 0.999) : 0;
			if (alpha > 0) {
				for (let p = 0; p < estimate.length; p++) {
					const v = current[p] + alpha * (current[p] - previous[p]);
					estimate[p] = v > 0 ? v : 0;
				}
			}
		}
		// estimate now holds the (possibly extrapolated) point y_k the RL step starts from.
		convolve(forward, backend, forwardSpectrum);
		for (let p = 0; p < model.length; p++) {
			const m = model[p];
			model[p] = m > MIN_MODEL ? data[p] / m : 0;
		}
		convolve(adjoint, backend, adjointSpectrum);
		if (divergence && gx && gy) tvDivergence(estimate, er, ec, divergence, gx, gy);
		let changeSq = 0;
		let normSq = 0;
		for (let p = 0; p < estimate.length; p++) {
			const wgt = weights[p];
			const start = estimate[p];
			let next = 0;
			if (wgt >= MIN_WEIGHT) {
				const divisor = divergence ? wgt - lambda * divergence[p] : wgt;
				next = divisor > 0 ? (start * correction[p]) / divisor : start;
			}
			if (step && lastStep) {
				lastStep[p] = step[p];
				step[p] = next - start;
			}
			const d = next - current[p];
			changeSq += d * d;
			normSq += current[p] * current[p];
			estimate[p] = next;
		}
		if (previous) previous.set(current);
		iterationsRun = k + 1;
		opts.onProgress?.(iterationsRun, iterations);
		if (tolerance > 0 && normSq > 0 && Math.sqrt(changeSq / normSq) < tolerance) {
			stoppedEarly = iterationsRun < iterations;
			break;
		}
	}
	const out = createPlane(h, w);
	for (let i = 0; i < h; i++) out.data.set(estimate.subarray((i + top) * ec + left, (i + top) * ec + left + w), i * w);
	return { plane: out, iterationsRun, stoppedEarly };
}

/** Flat start at the data mean, or the given estimate replicated outwards to the extended frame. */
function initialise(estimate: Float32Array, er: number, ec: number, top: number, left: number, data: Float32Array, h: number, w: number, initial?: Plane): void {
	let sum = 0;
	for (let p = 0; p < data.length; p++) sum += data[p];
	const mean = sum / data.length;
	const floor = Math.max(mean * MIN_START, 1e-12);
	if (!initial) {
		estimate.fill(Math.max(mean, floor));
		return;
	}
	const start = planeValues(initial);
	for (let i = 0; i < er; i++) {
		const si = Math.min(h - 1, Math.max(0, i - top));
		for (let j = 0; j < ec; j++) {
			const sj = Math.min(w - 1, Math.max(0, j - left));
			const v = start[si * w + sj];
			estimate[i * ec + j] = v > floor ? v : floor;
		}
	}
}
