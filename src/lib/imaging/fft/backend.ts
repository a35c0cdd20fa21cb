/**
 * The one interface every FFT implementation in the engine sits behind. Complex data are
 * interleaved (re, im, re, im, …) in Float64Array, row-major [rows, cols].
 *
 * Conventions (those of ndarray-fft 1.0.3 and fft.js 4.0.4, which the tests hold every backend to):
 * forward X[k, l] = Σ x[n, m] · e^{−2πi(kn/rows + lm/cols)}, unscaled;
 * inverse x[n, m] = (1 / (rows·cols)) Σ X[k, l] · e^{+2πi(kn/rows + lm/cols)}.
 */
export interface FftBackend {
	/** Name written into run records, e.g. 'fft.js-4.0.4'. */
	readonly name: string;
	/** True when the backend can transform an axis of this length. */
	supports(length: number): boolean;
	/** Smallest length ≥ n that this backend transforms quickly. */
	fastLength(n: number): number;
	/** In-place 2-D DFT of an interleaved complex array of rows × cols values. */
	fft2(data: Float64Array, rows: number, cols: number, inverse: boolean): void;
	/**
	 * Optional: run independent jobs (block convolutions) in parallel. The engine only uses it for
	 * work split into a fixed list of blocks whose arithmetic does not depend on the thread that
	 * runs it, so results stay bit-identical with or without it.
	 */
	readonly parallel?: import('./parallel').BlockParallelism;
	/**
	 * Optional fused overlap-save step for tile pairs [firstPair, endPair) of a job (the same
	 * arithmetic as the generic convolvePairs, with the block kept in the backend's own memory).
	 * Every thread runs the same code, so the bits do not depend on the partition.
	 */
	convolvePairs?(job: import('../restoration/block-convolution').ConvolutionJob, kernelSpectrum: Float64Array, firstPair: number, endPair: number): void;
}

/** Guard shared by backends: a 2-D transform needs positive integer sizes and a matching buffer. */
export function assertComplexShape(data: Float64Array, rows: number, cols: number): void {
	if (!Number.isInteger(rows) || !Number.isInteger(cols) || rows < 1 || cols < 1) {
		throw new RangeError(`transform size must be positive integers, got ${rows}×${cols}`);
	}
	if (data.length !== 2 * rows * cols) {
		throw new RangeError(
			`complex buffer holds ${data.length} numbers, expected 2·${rows}·${cols} = ${2 * rows * cols}`
		);
	}
}
