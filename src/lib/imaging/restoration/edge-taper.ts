import type { FftBackend } from '../fft/backend';
import { defaultFftBackend } from '../fft/default-backend';
import type { Plane } from '../types';
import { chooseBlockSize, convolve } from './block-convolution';

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
export function edgeTaper(values: Float64Array | Float32Array, rows: number, cols: number, psf: Plane, backend: FftBackend = defaultFftBackend()): Float64Array {
	const [kh, kw] = psf.shape;
	if (values.length !== rows * cols) throw new RangeError(`buffer holds ${values.length} values, expected ${rows * cols}`);
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
	const src = Float32Array.from(values);
	const blurred = new Float32Array(rows * cols);
	convolve(
		{
			src,
			srcRows: rows,
			srcCols: cols,
			out: blurred,
			outRows: rows,
			outCols: cols,
			rowOffset: -((kh - 1) >> 1),
			colOffset: -((kw - 1) >> 1),
			kernel,
			kernelRows: kh,
			kernelCols: kw,
			outside: 'wrap',
			blockSize: chooseBlockSize(kh, kw, rows, cols)
		},
		backend
	);
	const out = new Float64Array(rows * cols);
	for (let i = 0; i < rows; i++) {
		const ar = 1 - betaRows[i];
		for (let j = 0; j < cols; j++) {
			const alpha = ar * (1 - betaCols[j]);
			const p = i * cols + j;
			out[p] = alpha * values[p] + (1 - alpha) * blurred[p];
		}
	}
	return out;
}
