import type { FftBackend } from '../fft/backend';
import { defaultFftBackend } from '../fft/default-backend';
import type { Plane } from '../types';

/** Optical transfer function of a kernel sampled on a rows × cols DFT grid. */
export interface TransferFunction {
	rows: number;
	cols: number;
	re: Float64Array;
	im: Float64Array;
	/** |H| at every grid frequency, row-major [rows, cols]. */
	magnitude(): Float64Array;
}

/**
 * OTF of a kernel on an N×M grid: H[k, l] = Σ psf[a, b] · e^{−2πi(k(a − c_a)/N + l(b − c_b)/M)}, with
 * the kernel centre (c_a, c_b) placed at the origin (wrapped), so a symmetric kernel has a real OTF.
 * Frequency (k, l) corresponds to (k/N, l/M) cycles per pixel, folded to (−½, ½].
 * @see J. W. Goodman, Introduction to Fourier Optics, 3rd ed., Roberts & Co. 2005, §6.3 (OTF);
 *   Gonzalez & Woods, Digital Image Processing, 4th ed., 2018, §4.6 (DFT of a centred kernel).
 * @throws RangeError when the grid is smaller than the kernel.
 */
export function transferFunction(psf: Plane, shape: [number, number], backend: FftBackend = defaultFftBackend()): TransferFunction {
	const [rows, cols] = shape;
	const [kh, kw] = psf.shape;
	if (!Number.isInteger(rows) || !Number.isInteger(cols) || rows < kh || cols < kw) {
		throw new RangeError(`transfer grid ${rows}×${cols} must be integers at least the kernel size ${kh}×${kw}`);
	}
	const ca = (kh - 1) >> 1;
	const cb = (kw - 1) >> 1;
	const data = new Float64Array(2 * rows * cols);
	for (let a = 0; a < kh; a++) {
		const r = (a - ca + rows) % rows;
		for (let b = 0; b < kw; b++) data[2 * (r * cols + ((b - cb + cols) % cols))] += psf.get(a, b);
	}
	backend.fft2(data, rows, cols, false);
	const n = rows * cols;
	const re = new Float64Array(n);
	const im = new Float64Array(n);
	for (let i = 0; i < n; i++) {
		re[i] = data[2 * i];
		im[i] = data[2 * i + 1];
	}
	return {
		rows,
		cols,
		re,
		im,
		magnitude: () => re.map((r, i) => Math.hypot(r, im[i]))
	};
}
