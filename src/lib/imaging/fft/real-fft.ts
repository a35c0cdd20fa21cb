import type { NdArray } from 'ndarray';
import type { FftBackend } from './backend';
import type { BlockParallelism } from './parallel';
import { defaultFftBackend } from './default-backend';

/**
 * Half spectrum of a real rows × cols array: columns 0 … ⌊cols/2⌋ (Hermitian symmetry supplies the
 * rest), interleaved complex, row-major [rows, ⌊cols/2⌋ + 1].
 */
export interface HalfSpectrum {
	rows: number;
	cols: number;
	halfCols: number;
	data: Float64Array;
}

function assertShape(rows: number, cols: number): void {
	if (!Number.isInteger(rows) || !Number.isInteger(cols) || rows < 1 || cols < 1) {
		throw new RangeError(`real transform needs a positive integer size, got ${rows}×${cols}`);
	}
}

/**
 * 2-D real-to-complex DFT of a real array zero-padded (bottom and right) to rows × cols.
 * Even and odd columns are packed as one complex array of half the width, z = x[:, 2m] + i·x[:, 2m+1],
 * transformed once, and separated:
 * X[k, l] = A[k, l] + e^{−2πil/cols}·B[k, l], A = (Z[k,l] + Z*[−k,−l]) / 2, B = (Z[k,l] − Z*[−k,−l]) / 2i.
 * @see W. H. Press et al., Numerical Recipes, 3rd ed., Cambridge University Press 2007, §12.3.2
 *   ("FFT of real functions").
 * @param values a 2-D ndarray (any layout) of at most rows × cols values
 * Odd widths fall back to one complex transform of the full array.
 * @param shape transform size [rows, cols]. @default the array's own shape
 */
export function rfft2(
	values: NdArray,
	shape: [number, number] = [values.shape[0], values.shape[1]],
	backend: FftBackend = defaultFftBackend()
): HalfSpectrum {
	const [rows, cols] = shape;
	assertShape(rows, cols);
	const [h, w] = values.shape;
	if (h > rows || w > cols) throw new RangeError(`array ${h}×${w} exceeds transform size ${rows}×${cols}`);
	const real = new Float64Array(rows * cols);
	for (let i = 0; i < h; i++) {
		for (let j = 0; j < w; j++) real[i * cols + j] = values.get(i, j);
	}
	return rfft2Buffer(real, rows, cols, backend);
}

/**
 * Same as {@link rfft2} for a contiguous row-major Float32/Float64 buffer of rows × cols values.
 * @param consume when true and `values` is a Float64Array of even width, it is used as the packed
 *   work array and overwritten (saves one rows × cols Float64 allocation on large images). @default false
 */
export function rfft2Buffer(
	values: Float32Array | Float64Array,
	rows: number,
	cols: number,
	backend: FftBackend = defaultFftBackend(),
	consume = false,
	/** Receives the half spectrum's 2·rows·(⌊cols/2⌋ + 1) numbers (even widths). @default a new array */
	output?: Float64Array
): HalfSpectrum {
	assertShape(rows, cols);
	if (values.length !== rows * cols) {
		throw new RangeError(`buffer holds ${values.length} values, expected ${rows * cols}`);
	}
	if (cols % 2 !== 0) return halfOfComplex(values, rows, cols, backend);
	// z[n, m] = x[n, 2m] + i·x[n, 2m+1] has the row-major layout of x itself.
	const z = consume && values instanceof Float64Array ? values : Float64Array.from(values);
	backend.fft2(z, rows, cols / 2, false);
	return separate(z, rows, cols, backend.parallel, output);
}

/** cos and sin of sign·2πl/cols for l = 0 … cols/2. */
function twiddles(cols: number, sign: 1 | -1): [Float64Array, Float64Array] {
	const n = cols / 2 + 1;
	const c = new Float64Array(n);
	const s = new Float64Array(n);
	for (let l = 0; l < n; l++) {
		const angle = (sign * 2 * Math.PI * l) / cols;
		c[l] = Math.cos(angle);
		s[l] = Math.sin(angle);
	}
	return [c, s];
}

/** Odd widths cannot be packed in pairs: transform as complex and keep the first ⌊cols/2⌋ + 1 columns. */
function halfOfComplex(values: Float32Array | Float64Array, rows: number, cols: number, backend: FftBackend): HalfSpectrum {
	const full = new Float64Array(2 * rows * cols);
	for (let i = 0; i < values.length; i++) full[2 * i] = values[i];
	backend.fft2(full, rows, cols, false);
	const halfCols = Math.floor(cols / 2) + 1;
	const data = new Float64Array(2 * rows * halfCols);
	for (let k = 0; k < rows; k++) data.set(full.subarray(2 * k * cols, 2 * (k * cols + halfCols)), 2 * k * halfCols);
	return { rows, cols, halfCols, data };
}

/** Inverse of halfOfComplex: rebuild the full Hermitian spectrum, invert, keep the real part. */
function realOfComplex(spectrum: HalfSpectrum, backend: FftBackend, out: Float64Array): Float64Array {
	const { rows, cols, halfCols, data } = spectrum;
	const full = new Float64Array(2 * rows * cols);
	for (let k = 0; k < rows; k++) {
		const kc = (rows - k) % rows;
		for (let l = 0; l < cols; l++) {
			const o = 2 * (k * cols + l);
			if (l < halfCols) {
				full[o] = data[2 * (k * halfCols + l)];
				full[o + 1] = data[2 * (k * halfCols + l) + 1];
			} else {
				full[o] = data[2 * (kc * halfCols + cols - l)];
				full[o + 1] = -data[2 * (kc * halfCols + cols - l) + 1];
			}
		}
	}
	backend.fft2(full, rows, cols, true);
	for (let i = 0; i < out.length; i++) out[i] = full[2 * i];
	return out;
}

function separate(z: Float64Array, rows: number, cols: number, parallel: BlockParallelism | undefined, output?: Float64Array): HalfSpectrum {
	const halfCols = cols / 2 + 1;
	const out = output ?? (parallel ? allocateRows(parallel, 2 * rows * halfCols) : new Float64Array(2 * rows * halfCols));
	if (out.length !== 2 * rows * halfCols) throw new RangeError(`spectrum output holds ${out.length} numbers, expected ${2 * rows * halfCols}`);
	if (parallel?.rows && splittable(rows * cols, z, out)) parallel.rows({ kind: 'separate', z, rows, cols, out });
	else separateRows(z, rows, cols, out, 0, rows);
	return { rows, cols, halfCols, data: out };
}

/**
 * Rows [first, end) of the half spectrum from the packed transform Z (see {@link rfft2}); reads rows
 * k and −k of Z, writes rows k of `out`, so threads may share the rows.
 */
export function separateRows(z: Float64Array, rows: number, cols: number, out: Float64Array, first: number, end: number): void {
	const mh = cols / 2;
	const halfCols = mh + 1;
	const [cosTable, sinTable] = twiddles(cols, -1);
	// Column l of Z and column −l of Z* (both wrapped to [0, mh)), looked up instead of two % per element.
	const column = new Int32Array(mh + 1);
	const mirrored = new Int32Array(mh + 1);
	for (let l = 0; l <= mh; l++) {
		column[l] = l % mh;
		mirrored[l] = (mh - l) % mh;
	}
	for (let k = first; k < end; k++) {
		const kc = (rows - k) % rows;
		for (let l = 0; l <= mh; l++) {
			const a = 2 * (k * mh + column[l]);
			const b = 2 * (kc * mh + mirrored[l]);
			const zr = z[a];
			const zi = z[a + 1];
			const cr = z[b];
			const ci = -z[b + 1];
			const ar = 0.5 * (zr + cr);
			const ai = 0.5 * (zi + ci);
			// B = (Z − conj Z[−k,−l]) / 2i
			const br = 0.5 * (zi - ci);
			const bi = -0.5 * (zr - cr);
			const wr = cosTable[l];
			const wi = sinTable[l];
			const o = 2 * (k * halfCols + l);
			out[o] = ar + wr * br - wi * bi;
			out[o + 1] = ai + wr * bi + wi * br;
		}
	}
}

/** A buffer the pool's threads share when the pool can split row passes, else an ordinary one. */
function allocateRows(parallel: BlockParallelism, length: number): Float64Array {
	return parallel.rows && parallel.allocate64 ? parallel.allocate64(length) : new Float64Array(length);
}

/** Smallest array (real values) whose row passes are split between threads (common practice, no source). */
const PARALLEL_MIN_VALUES = 2 ** 19;

/** True when a row pass over `size` values of these buffers is worth splitting and every thread can see them. */
export function splittable(size: number, ...buffers: Float64Array[]): boolean {
	return size >= PARALLEL_MIN_VALUES && typeof SharedArrayBuffer !== 'undefined' && buffers.every((b) => b.buffer instanceof SharedArrayBuffer);
}

/**
 * Inverse of {@link rfft2}: real rows × cols array from its half spectrum, scaled by 1/(rows·cols).
 * The half spectrum is recombined into the packed half-width complex array,
 * Z[k, l] = A + i·B, A = (X[k,l] + X*[−k, cols/2 − l]) / 2, B = (X[k,l] − X*[−k, cols/2 − l]) · e^{2πil/cols} / 2,
 * inverted once and de-interleaved.
 * @see W. H. Press et al., Numerical Recipes, 3rd ed., 2007, §12.3.2.
 */
export function irfft2(
	spectrum: HalfSpectrum,
	backend: FftBackend = defaultFftBackend(),
	output?: Float64Array
): Float64Array {
	const { rows, cols, halfCols, data } = spectrum;
	assertShape(rows, cols);
	if (halfCols !== Math.floor(cols / 2) + 1 || data.length !== 2 * rows * halfCols) {
		throw new RangeError('half spectrum does not match its declared size');
	}
	const out = output ?? new Float64Array(rows * cols);
	if (out.length !== rows * cols) throw new RangeError(`output holds ${out.length} values, expected ${rows * cols}`);
	if (cols % 2 !== 0) return realOfComplex(spectrum, backend, out);
	const mh = cols / 2;
	// The packed complex array z[n, m] = x[n, 2m] + i·x[n, 2m+1] has exactly the row-major layout of
	// the real output, so it is built in place.
	const z = out;
	const parallel = backend.parallel;
	if (parallel?.rows && splittable(rows * cols, data, z)) parallel.rows({ kind: 'pack', data, rows, cols, z });
	else packRows(data, rows, cols, z, 0, rows);
	backend.fft2(z, rows, mh, true);
	return z;
}

/**
 * Rows [first, end) of the packed array Z that {@link irfft2} inverts; reads rows k and −k of the
 * half spectrum, writes rows k of `z`, so threads may share the rows.
 */
export function packRows(data: Float64Array, rows: number, cols: number, z: Float64Array, first: number, end: number): void {
	const mh = cols / 2;
	const halfCols = mh + 1;
	const [cosTable, sinTable] = twiddles(cols, 1);
	for (let k = first; k < end; k++) {
		const kc = (rows - k) % rows;
		for (let l = 0; l < mh; l++) {
			const a = 2 * (k * halfCols + l);
			const b = 2 * (kc * halfCols + (mh - l));
			const xr = data[a];
			const xi = data[a + 1];
			const cr = data[b];
			const ci = -data[b + 1];
			const ar = 0.5 * (xr + cr);
			const ai = 0.5 * (xi + ci);
			const dr = 0.5 * (xr - cr);
			const di = 0.5 * (xi - ci);
			const wr = cosTable[l];
			const wi = sinTable[l];
			const br = dr * wr - di * wi;
			const bi = dr * wi + di * wr;
			const o = 2 * (k * mh + l);
			z[o] = ar - bi;
			z[o + 1] = ai + br;
		}
	}
}
