import type { PffftModule } from '@echogarden/pffft-wasm/simd';
import { convolvePairs, gatherTile, scatterTile, tileLayout, type ConvolutionJob } from '../restoration/block-convolution';
import { assertComplexShape, type FftBackend } from './backend';
import { DefaultFftBackend } from './default-backend';
import { isSmooth, nextSmoothMultiple } from './fast-size';
import type { BlockParallelism } from './parallel';

/** pffft_direction_t and pffft_transform_t of pffft.h. */
const FORWARD = 0 as const;
const BACKWARD = 1 as const;
const COMPLEX = 1;
/** PFFFT's SIMD build needs complex lengths divisible by SIMD_SZ² = 16 (pffft.c, pffft_new_setup). */
const COMPLEX_MULTIPLE = 16;
/** Square tiles of the transposes, and columns per batch: 32 complex values are 256 bytes (float32) or 512 (Float64), a few cache lines. */
const TILE = 32;
/**
 * Floats of one row slab in WASM memory (1 MiB). Large planes stream through a few MiB of WASM memory
 * instead of being copied in whole: WASM memory never shrinks, and a 24 MP plane would pin 200 MB.
 */
const SLAB_FLOATS = 2 ** 18;
/** Smallest transform (complex points) handed to a thread pool; below it the hand-over costs more than it saves (common practice, no source). */
const PARALLEL_MIN_POINTS = 2 ** 18;

/** Package and build recorded in run records; a different build would round differently. */
export const PFFFT_PACKAGE = 'pffft-wasm-0.4.2-simd';

/** Buffers inside the WASM memory: two work areas (for the transposes) and PFFFT's scratch line. */
interface HeapBuffers {
	a: number;
	b: number;
	work: number;
	planeFloats: number;
	workFloats: number;
}

/**
 * 2-D complex DFT with PFFFT (J. Pommier's SIMD port of FFTPACK, WASM SIMD build of the npm package
 * `@echogarden/pffft-wasm` 0.4.2), for axes of length 16·2^a·3^b·5^c; other lengths go to the
 * Float64 fallback (fft.js / ndarray-fft), so every size works.
 *
 * Row–column method in the spirit of FFTW's design (Frigo & Johnson 2005): rows are transformed
 * as contiguous 1-D mixed-radix lines, a 1 MiB slab at a time; columns are gathered 32 at a time
 * into contiguous lines (a tiled transpose), transformed and scattered back. Arithmetic is single
 * precision (every value between the passes is a float32); the tests bound the error against the
 * Float64 ndarray-fft oracle and fft.js.
 *
 * Deterministic: the same WASM code (IEEE single precision, no relaxed SIMD, no threads inside) gives
 * the same bits on every machine and run, whichever thread calls it.
 * @see J. W. Cooley, J. W. Tukey, "An algorithm for the machine calculation of complex Fourier
 *   series", Math. Comp. 19:297–301, 1965, doi:10.1090/S0025-5718-1965-0178586-1;
 *   P. N. Swarztrauber, "Vectorizing the FFTs", in Parallel Computations, Academic Press 1982
 *   (FFTPACK); J. Pommier, PFFFT, https://bitbucket.org/jpommier/pffft (BSD-like FFTPACK licence);
 *   M. Frigo, S. G. Johnson, "The design and implementation of FFTW3", Proc. IEEE 93(2):216–231,
 *   2005, doi:10.1109/JPROC.2004.840301.
 */
export class PffftBackend implements FftBackend {
	readonly name: string;
	readonly parallel?: BlockParallelism;
	private readonly setups = new Map<number, number>();
	private heap: HeapBuffers | undefined;
	private readonly transposedKernels = new WeakMap<Float64Array, Float32Array>();

	/**
	 * @param wasm an initialised PFFFT module (see loadPffftBackend in pffft-loader.ts)
	 * @param fallback transforms sizes PFFFT cannot. @default fft.js for powers of two, else ndarray-fft
	 * @param parallel optional thread pool for block convolutions (Node: node/thread-pool.ts)
	 */
	constructor(
		private readonly wasm: PffftModule,
		private readonly fallback: FftBackend = new DefaultFftBackend(),
		parallel?: BlockParallelism
	) {
		if (wasm._pffft_simd_size() !== 4) throw new RangeError('the PFFFT module is not the SIMD build the engine records');
		this.name = `${PFFFT_PACKAGE}, else ${fallback.name}`;
		this.parallel = parallel;
	}

	/** True when PFFFT itself (not the fallback) transforms an axis of this length. */
	native(length: number): boolean {
		return length % COMPLEX_MULTIPLE === 0 && isSmooth(length);
	}

	supports(length: number): boolean {
		return this.fallback.supports(length);
	}

	/** 5-smooth multiple of 32, so that real transforms (which halve the width) stay native. */
	fastLength(n: number): number {
		return nextSmoothMultiple(n, 2 * COMPLEX_MULTIPLE);
	}

	fft2(data: Float64Array, rows: number, cols: number, inverse: boolean): void {
		assertComplexShape(data, rows, cols);
		if (!this.native(rows) || !this.native(cols)) {
			this.fallback.fft2(data, rows, cols, inverse);
			return;
		}
		const pool = this.parallel;
		if (pool?.fft2 && rows * cols >= PARALLEL_MIN_POINTS && typeof SharedArrayBuffer !== 'undefined' && data.buffer instanceof SharedArrayBuffer) {
			pool.fft2(data, rows, cols, inverse);
			return;
		}
		this.transformRows(data, rows, cols, inverse, 0, rows);
		this.transformColumns(data, rows, cols, inverse, 0, cols);
	}

	/**
	 * Row pass of {@link fft2} over rows [first, end), a slab of contiguous rows at a time. Every row is
	 * an independent line, so any split of the rows between threads gives the same bits.
	 */
	transformRows(data: Float64Array, rows: number, cols: number, inverse: boolean, first: number, end: number): void {
		const direction = inverse ? BACKWARD : FORWARD;
		const slabRows = Math.max(1, Math.floor(SLAB_FLOATS / (2 * cols)));
		const { a, work } = this.reserve(2 * Math.max(slabRows * cols, TILE * rows), 2 * Math.max(rows, cols));
		const heap = this.wasm.HEAPF32;
		const base = a >> 2;
		// float32 → float64 → float32 is exact, so the column pass sees the same numbers as if the
		// plane had stayed in WASM memory.
		for (let i0 = first; i0 < end; i0 += slabRows) {
			const n = Math.min(slabRows, end - i0);
			heap.set(data.subarray(2 * i0 * cols, 2 * (i0 + n) * cols), base);
			this.lines(a, n, cols, direction, work);
			data.set(heap.subarray(base, base + 2 * n * cols), 2 * i0 * cols);
		}
	}

	/**
	 * Column pass of {@link fft2} over columns [first, end) (scaled by 1/(rows·cols) when inverse):
	 * TILE columns are gathered into TILE contiguous lines, transformed and put back. Columns are
	 * independent lines, so any split between threads gives the same bits.
	 */
	transformColumns(data: Float64Array, rows: number, cols: number, inverse: boolean, first: number, end: number): void {
		const direction = inverse ? BACKWARD : FORWARD;
		const slabRows = Math.max(1, Math.floor(SLAB_FLOATS / (2 * cols)));
		const { a, work } = this.reserve(2 * Math.max(slabRows * cols, TILE * rows), 2 * Math.max(rows, cols));
		const heap = this.wasm.HEAPF32;
		const base = a >> 2;
		const scale = inverse ? 1 / (rows * cols) : 1;
		for (let j0 = first; j0 < end; j0 += TILE) {
			const width = Math.min(TILE, end - j0);
			for (let i = 0; i < rows; i++) {
				for (let j = 0, s = 2 * (i * cols + j0), d = base + 2 * i; j < width; j++, s += 2, d += 2 * rows) {
					heap[d] = data[s];
					heap[d + 1] = data[s + 1];
				}
			}
			this.lines(a, width, rows, direction, work);
			for (let i = 0; i < rows; i++) {
				for (let j = 0, s = base + 2 * i, d = 2 * (i * cols + j0); j < width; j++, s += 2 * rows, d += 2) {
					data[d] = heap[s] * scale;
					data[d + 1] = heap[s + 1] * scale;
				}
			}
		}
	}

	/**
	 * Fused overlap-save (see block-convolution.ts): each B×B block is gathered straight into WASM
	 * memory as float32, transformed along rows, transposed, transformed along the (now contiguous)
	 * columns, multiplied by the kernel spectrum in that transposed order, and brought back the same
	 * way — two transposes per block instead of four and no Float64 round trips.
	 */
	convolvePairs(job: ConvolutionJob, kernelSpectrum: Float64Array, firstPair: number, endPair: number): void {
		const n = job.blockSize;
		if (!this.native(n)) {
			convolvePairs(job, kernelSpectrum, this.fallback, firstPair, endPair);
			return;
		}
		const count = n * n;
		const { a, b, work } = this.reserve(2 * count, 2 * n);
		const kernelT = this.transposedKernel(kernelSpectrum, n);
		const heap = this.wasm.HEAPF32;
		const planeA = new Float64Array(heap.buffer, a, count);
		const planeB = new Float64Array(heap.buffer, b, count);
		const layout = tileLayout(job);
		for (let pair = firstPair; pair < endPair; pair++) {
			heap.fill(0, a >> 2, (a >> 2) + 2 * count);
			const first = 2 * pair;
			const second = first + 1 < layout.count;
			gatherTile(job, layout, first, heap, a >> 2);
			if (second) gatherTile(job, layout, first + 1, heap, (a >> 2) + 1);
			this.lines(a, n, n, FORWARD, work);
			transpose(planeA, planeB, n, n);
			this.lines(b, n, n, FORWARD, work);
			multiplyComplex(heap, b >> 2, kernelT);
			this.lines(b, n, n, BACKWARD, work);
			transpose(planeB, planeA, n, n);
			this.lines(a, n, n, BACKWARD, work);
			scatterTile(job, layout, first, heap, a >> 2, 1 / count);
			if (second) scatterTile(job, layout, first + 1, heap, (a >> 2) + 1, 1 / count);
		}
	}

	/**
	 * The kernel spectrum transposed to float32, kept while the spectrum array lives: the strips of an
	 * edge taper and the iterations of Richardson–Lucy pass the same (never modified) spectra again.
	 */
	private transposedKernel(kernelSpectrum: Float64Array, n: number): Float32Array {
		const cached = this.transposedKernels.get(kernelSpectrum);
		if (cached?.length === 2 * n * n) return cached;
		const transposed = new Float32Array(2 * n * n);
		for (let i = 0; i < n; i++) {
			for (let j = 0; j < n; j++) {
				transposed[2 * (j * n + i)] = kernelSpectrum[2 * (i * n + j)];
				transposed[2 * (j * n + i) + 1] = kernelSpectrum[2 * (i * n + j) + 1];
			}
		}
		this.transposedKernels.set(kernelSpectrum, transposed);
		return transposed;
	}

	/** In-place ordered 1-D transforms of `count` contiguous complex lines of `length` at byte offset `pointer`. */
	private lines(pointer: number, count: number, length: number, direction: typeof FORWARD | typeof BACKWARD, work: number): void {
		const setup = this.setup(length);
		for (let i = 0, p = pointer; i < count; i++, p += 8 * length) this.wasm._pffft_transform_ordered(setup, p, p, work, direction);
	}

	private setup(n: number): number {
		let setup = this.setups.get(n);
		if (setup === undefined) {
			setup = this.wasm._pffft_new_setup(n, COMPLEX);
			if (!setup) throw new RangeError(`PFFFT cannot transform length ${n}`);
			this.setups.set(n, setup);
		}
		return setup;
	}

	/** Grow (never shrink) the WASM-side work areas; they stay a few MiB because large planes stream through them. */
	private reserve(planeFloats: number, workFloats: number): HeapBuffers {
		const heap = this.heap;
		if (heap && heap.planeFloats >= planeFloats && heap.workFloats >= workFloats) return heap;
		if (heap) for (const p of [heap.a, heap.b, heap.work]) this.wasm._pffft_aligned_free(p);
		const plane = Math.max(planeFloats, heap?.planeFloats ?? 0);
		const line = Math.max(workFloats, heap?.workFloats ?? 0);
		const a = this.wasm._pffft_aligned_malloc(4 * plane);
		const b = this.wasm._pffft_aligned_malloc(4 * plane);
		const work = this.wasm._pffft_aligned_malloc(4 * line);
		if (!a || !b || !work) throw new RangeError(`PFFFT could not allocate ${(8 * plane) / 2 ** 20} MiB in WASM memory`);
		this.heap = { a, b, work, planeFloats: plane, workFloats: line };
		return this.heap;
	}
}

/** heap[base …] ·= kernel elementwise, complex interleaved; products formed in double, stored as float32. */
function multiplyComplex(heap: Float32Array, base: number, kernel: Float32Array): void {
	for (let p = 0, q = base; p < kernel.length; p += 2, q += 2) {
		const xr = heap[q];
		const xi = heap[q + 1];
		const kr = kernel[p];
		const ki = kernel[p + 1];
		heap[q] = xr * kr - xi * ki;
		heap[q + 1] = xr * ki + xi * kr;
	}
}

/** dst (cols × rows) = srcᵀ (rows × cols); one element is a float32 complex pair moved as 8 bytes. */
function transpose(src: Float64Array, dst: Float64Array, rows: number, cols: number): void {
	for (let i0 = 0; i0 < rows; i0 += TILE) {
		const iEnd = Math.min(rows, i0 + TILE);
		for (let j0 = 0; j0 < cols; j0 += TILE) {
			const jEnd = Math.min(cols, j0 + TILE);
			for (let i = i0; i < iEnd; i++) {
				for (let j = j0, s = i * cols + j0; j < jEnd; j++, s++) dst[j * rows + i] = src[s];
			}
		}
	}
}
