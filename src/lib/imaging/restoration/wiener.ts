import type { FftBackend } from '../fft/backend';
import { defaultFftBackend } from '../fft/default-backend';
import type { BlockParallelism } from '../fft/parallel';
import { irfft2, rfft2Buffer, splittable, type HalfSpectrum } from '../fft/real-fft';
import { createPlane, isContiguous, planeValues, type Plane } from '../types';
import { edgeTaper } from './edge-taper';
import { mirrorPad } from './padding';
import type { Workspace } from './workspace';

/** Options of {@link wienerDeconvolve}. */
export interface WienerOptions {
	/** Noise-to-signal ratio (constant) or regularisation weight γ (Laplacian). @default 1e-3 */
	nsr?: number;
	/** 'constant': 1/(|H|² + NSR); 'laplacian': constrained least squares, 1/(|H|² + γ|P|²). @default 'constant' */
	regulariser?: 'constant' | 'laplacian';
	/**
	 * 'taper' (and 'extended', a synonym here): the image is mirror-padded by at least one kernel size
	 * to a fast FFT size and the padded frame's edge is tapered; 'circular': the image is treated as
	 * periodic (transform at its own size). @default 'taper'
	 */
	boundary?: 'taper' | 'extended' | 'circular';
	/** FFT implementation. @default the engine's default backend */
	fft?: FftBackend;
	/**
	 * Buffers and kernel transfer functions kept across calls with the same PSF and plane size (the
	 * channels of one image): the OTF is transformed once and no large array is re-allocated.
	 * @default none (everything is allocated per call)
	 */
	workspace?: Workspace;
	/**
	 * Receives the result (the input's size); may be the input plane itself, which is read in full
	 * before anything is written. @default a new plane
	 */
	output?: Plane;
}

/** Geometry of the padded Wiener domain, for run records. */
export interface WienerPadding {
	rows: number;
	cols: number;
	top: number;
	left: number;
}

/** Padded domain used by {@link wienerDeconvolve} for an image and kernel. */
export function wienerPadding(height: number, width: number, kernelShape: [number, number], boundary: WienerOptions['boundary'], backend: FftBackend = defaultFftBackend()): WienerPadding {
	if (boundary === 'circular') return { rows: height, cols: width, top: 0, left: 0 };
	const [kh, kw] = kernelShape;
	const margin = Math.max(kh, kw);
	const rows = backend.fastLength(height + 2 * margin);
	const cols = backend.fastLength(width + 2 * margin);
	return { rows, cols, top: (rows - height) >> 1, left: (cols - width) >> 1 };
}

/** A zero-filled work array for in-place transforms: shared between threads when the backend can split its FFTs. */
function allocateTransform(length: number, backend: FftBackend): Float64Array {
	const pool = backend.parallel;
	return pool?.allocate64 && (pool.fft2 || pool.rows) ? pool.allocate64(length) : new Float64Array(length);
}

/**
 * Half-spectrum OTF of the kernel on a rows×cols grid, kernel centre at the origin (wrapped).
 */
export function kernelHalfSpectrum(psf: Plane, rows: number, cols: number, backend: FftBackend): HalfSpectrum {
	const [kh, kw] = psf.shape;
	if (rows < kh || cols < kw) throw new RangeError(`grid ${cols}×${rows} is smaller than the kernel ${kw}×${kh}`);
	const placed = allocateTransform(rows * cols, backend);
	const ca = (kh - 1) >> 1;
	const cb = (kw - 1) >> 1;
	for (let a = 0; a < kh; a++) {
		const r = (a - ca + rows) % rows;
		for (let b = 0; b < kw; b++) placed[r * cols + ((b - cb + cols) % cols)] += psf.get(a, b);
	}
	return rfft2Buffer(placed, rows, cols, backend, true);
}

/**
 * Squared magnitude of the DFT of the discrete Laplacian [[0, 1, 0], [1, −4, 1], [0, 1, 0]] at
 * frequency (k/rows, l/cols): (2cos(2πk/rows) + 2cos(2πl/cols) − 4)².
 */
export function laplacianPower(k: number, l: number, rows: number, cols: number): number {
	const p = 2 * Math.cos((2 * Math.PI * k) / rows) + 2 * Math.cos((2 * Math.PI * l) / cols) - 4;
	return p * p;
}

/**
 * Wiener deconvolution in the frequency domain:
 * X̂ = H* · Y / (|H|² + NSR) (constant) or X̂ = H* · Y / (|H|² + γ·|P|²) with P the Laplacian
 * (constrained least squares). NSR = 0 is the inverse filter.
 * @see N. Wiener, Extrapolation, Interpolation, and Smoothing of Stationary Time Series, MIT Press
 *   1949; B. R. Hunt, "The application of constrained least squares estimation to image restoration
 *   by digital computer", IEEE Trans. Computers C-22(9):805–812, 1973, doi:10.1109/TC.1973.5009169;
 *   Gonzalez & Woods, Digital Image Processing, 4th ed., 2018, §5.8–5.9. Boundary: mirror padding and
 *   edge tapering (Reeves 2005, doi:10.1109/TIP.2005.854474; R. Liu, J. Jia, "Reducing boundary
 *   artifacts in image deconvolution", ICIP 2008, doi:10.1109/ICIP.2008.4711802).
 * @returns a new plane of the input's size (values are not clipped).
 * @throws RangeError for a negative or non-finite NSR, or an image smaller than the kernel.
 */
export function wienerDeconvolve(plane: Plane, psf: Plane, opts: WienerOptions = {}): Plane {
	const nsr = opts.nsr ?? 1e-3;
	const regulariser = opts.regulariser ?? 'constant';
	const boundary = opts.boundary ?? 'taper';
	const backend = opts.fft ?? defaultFftBackend();
	if (!(nsr >= 0) || !Number.isFinite(nsr)) throw new RangeError(`nsr must be finite and ≥ 0, got ${nsr}`);
	if (regulariser !== 'constant' && regulariser !== 'laplacian') throw new RangeError(`unknown regulariser ${String(regulariser)}`);
	if (boundary !== 'taper' && boundary !== 'extended' && boundary !== 'circular') throw new RangeError(`unknown boundary ${String(boundary)}`);
	const [h, w] = plane.shape;
	const [kh, kw] = psf.shape;
	if (h < kh || w < kw) throw new RangeError(`image ${w}×${h} is smaller than the kernel ${kw}×${kh}`);
	const pad = wienerPadding(h, w, [kh, kw], boundary, backend);
	const src = planeValues(plane);
	const ws = opts.workspace;
	const size = pad.rows * pad.cols;
	// The transforms run in `domain`: in a thread pool's shared memory when the backend has one, so
	// that its 2-D FFTs can be split between threads.
	const allocate = (n: number) => allocateTransform(n, backend);
	const domain = ws ? ws.float64('wiener.domain', size, allocate) : allocate(size);
	if (boundary === 'circular') domain.set(src);
	else {
		mirrorPad(src, h, w, pad.rows, pad.cols, pad.top, pad.left, domain);
		edgeTaper(domain, pad.rows, pad.cols, psf, backend, domain);
	}
	// `domain` serves as the transform's work array and later receives the inverse: no extra copies.
	const halfSize = 2 * pad.rows * (Math.floor(pad.cols / 2) + 1);
	const spectrum = rfft2Buffer(domain, pad.rows, pad.cols, backend, true, ws && pad.cols % 2 === 0 ? ws.float64('wiener.spectrum', halfSize, allocate) : undefined);
	const computeOtf = () => kernelHalfSpectrum(psf, pad.rows, pad.cols, backend);
	const otf = ws ? ws.spectrum(`${pad.rows}×${pad.cols} ${backend.name}`, computeOtf) : computeOtf();
	applyWienerGain(spectrum, otf, nsr, regulariser, backend.parallel);
	const restored = irfft2(spectrum, backend, domain);
	const out = opts.output ?? createPlane(h, w);
	if (out.shape[0] !== h || out.shape[1] !== w || !isContiguous(out)) throw new RangeError(`output must be a contiguous ${w}×${h} plane`);
	for (let i = 0; i < h; i++) {
		const o = (i + pad.top) * pad.cols + pad.left;
		out.data.set(restored.subarray(o, o + w), i * w);
	}
	return out;
}

/**
 * Multiply a half spectrum in place by H* / (|H|² + NSR·R). Where the denominator is 0 the output is 0.
 * @param parallel splits the rows between threads when the spectra are in its shared memory. @default none
 */
export function applyWienerGain(spectrum: HalfSpectrum, otf: HalfSpectrum, nsr: number, regulariser: 'constant' | 'laplacian', parallel?: BlockParallelism): void {
	const { rows, cols, data } = spectrum;
	const laplacian = regulariser === 'laplacian';
	if (parallel?.rows && splittable(rows * cols, data, otf.data)) parallel.rows({ kind: 'gain', data, otf: otf.data, rows, cols, nsr, laplacian });
	else wienerGainRows(data, otf.data, rows, cols, nsr, laplacian, 0, rows);
}

/** Rows [first, end) of {@link applyWienerGain} on interleaved half spectra of rows × (⌊cols/2⌋ + 1). */
export function wienerGainRows(data: Float64Array, h: Float64Array, rows: number, cols: number, nsr: number, laplacian: boolean, first: number, end: number): void {
	const halfCols = Math.floor(cols / 2) + 1;
	const colTerm = new Float64Array(halfCols);
	for (let l = 0; l < halfCols; l++) colTerm[l] = 2 * Math.cos((2 * Math.PI * l) / cols) - 2;
	for (let k = first; k < end; k++) {
		const rowTerm = 2 * Math.cos((2 * Math.PI * k) / rows) - 2;
		for (let l = 0; l < halfCols; l++) {
			const p = 2 * (k * halfCols + l);
			const hr = h[p];
			const hi = h[p + 1];
			const lap = laplacian ? rowTerm + colTerm[l] : 0;
			const reg = laplacian ? nsr * lap * lap : nsr;
			const denom = hr * hr + hi * hi + reg;
			const yr = data[p];
			const yi = data[p + 1];
			if (denom === 0) {
				data[p] = 0;
				data[p + 1] = 0;
			} else {
				data[p] = (hr * yr + hi * yi) / denom;
				data[p + 1] = (hr * yi - hi * yr) / denom;
			}
		}
	}
}
