import type { FftBackend } from '../fft/backend';
import { defaultFftBackend } from '../fft/default-backend';
import type { Plane } from '../types';
import { chooseBlockSize, convolve, kernelBlockSpectrum } from './block-convolution';

/**
 * 1-D taper weight β(d) at distance d from the nearest border of an axis of length n: the
 * normalised autocorrelation of the PSF projected on that axis, 1 at the border, 0 from the
 * kernel's extent inwards.
 */
function borderWeights(projection: Float64Array, n: number): Float64Array {
	const k = projection.length;
	const ac = new Float64Array(k);
	for (let lag = 0; lag < k; lag++) {
		let s = 0;
		for (let m = 0; m + lag < k; m++) s += projection[m] * projection[m + lag];
		ac[lag] = s;
	}
	const out = new Float64Array(n);
	for (let i = 0; i < n; i++) {
		const d = Math.min(i, n - 1 - i);
		out[i] = d < k ? ac[d] / ac[0] : 0;
	}
	return out;
}

/**
 * Edge taper: J = α·I + (1 − α)·(k ⊛ I), with k ⊛ I the circular blur and
 * α(y, x) = (1 − β_rows(y))·(1 − β_cols(x)), β the normalised autocorrelation of the PSF's
 * projection on each axis. Near the frame the image is replaced by its own circular blur, which is
 * continuous across the wrap-around, so FFT deconvolution does not ring from the frame edge.
 * @see S. J. Reeves, "Fast image restoration without boundary artifacts", IEEE Trans. Image
 *   Processing 14(10):1448–1453, 2005, doi:10.1109/TIP.2005.854474 (discussion of edge tapering);
 *   the weighting follows the widely used `edgetaper` construction (common practice, no source).
 */
export function edgeTaper(
	values: Float64Array | Float32Array,
	rows: number,
	cols: number,
	psf: Plane,
	backend: FftBackend = defaultFftBackend(),
	/** Receives the result; may be `values` itself (all blurs are computed before any write). @default a new array */
	output: Float64Array = new Float64Array(rows * cols)
): Float64Array {
	const [kh, kw] = psf.shape;
	if (values.length !== rows * cols || output.length !== rows * cols) throw new RangeError(`buffers hold ${values.length} and ${output.length} values, expected ${rows * cols}`);
	if (rows < kh || cols < kw) throw new RangeError(`image ${cols}×${rows} is smaller than the kernel ${kw}×${kh}`);
	const rowProjection = new Float64Array(kh);
	const colProjection = new Float64Array(kw);
	const kernel = new Float64Array(kh * kw);
	for (let a = 0; a < kh; a++) {
		for (let b = 0; b < kw; b++) {
			const v = psf.get(a, b);
			kernel[a * kw + b] = v;
			rowProjection[a] += v;
			colProjection[b] += v;
		}
	}
	const betaRows = borderWeights(rowProjection, rows);
	const betaCols = borderWeights(colProjection, cols);
	// α = 1 (output = input) except within one kernel extent of the frame, where β > 0: the circular
	// blur is only needed on that band, computed as four strips (top, bottom, and the two sides between).
	const top = Math.min(kh, rows);
	const bottom = Math.max(top, rows - kh);
	const left = Math.min(kw, cols);
	const right = Math.max(left, cols - kw);
	const strips: [number, number, number, number][] = [[0, top, 0, cols], [bottom, rows, 0, cols], [top, bottom, 0, left], [top, bottom, right, cols]];
	// Strips of the same block size share one kernel spectrum (computed by the same code either way).
	const spectra = new Map<number, Float64Array>();
	const blurs = strips.map(([r0, r1, c0, c1]) => {
		const out = new Float32Array(Math.max(0, r1 - r0) * Math.max(0, c1 - c0));
		if (out.length === 0) return out;
		const job = {
			src: values, srcRows: rows, srcCols: cols, out, outRows: r1 - r0, outCols: c1 - c0,
			rowOffset: r0 - ((kh - 1) >> 1), colOffset: c0 - ((kw - 1) >> 1), kernel, kernelRows: kh, kernelCols: kw,
			outside: 'wrap' as const, blockSize: chooseBlockSize(kh, kw, r1 - r0, c1 - c0)
		};
		let spectrum = spectra.get(job.blockSize);
		if (!spectrum) spectra.set(job.blockSize, (spectrum = kernelBlockSpectrum(job, backend)));
		convolve(job, backend, spectrum);
		return out;
	});
	if (output !== values) output.set(values);
	strips.forEach(([r0, r1, c0, c1], s) => {
		const blurred = blurs[s];
		for (let i = r0; i < r1; i++) {
			const ar = 1 - betaRows[i];
			for (let j = c0, q = (i - r0) * (c1 - c0); j < c1; j++, q++) {
				const alpha = ar * (1 - betaCols[j]);
				const p = i * cols + j;
				output[p] = alpha * values[p] + (1 - alpha) * blurred[q];
			}
		}
	});
	return output;
}
