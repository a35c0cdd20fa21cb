import type { ConvolutionJob } from '../restoration/block-convolution';

/**
 * Optional multi-threaded execution injected through an {@link FftBackend}. Implementations split a
 * job's fixed list of blocks between threads; every block is computed by the same code on the same
 * numbers whichever thread runs it, so the output is bit-identical to the single-threaded path.
 * The pure modules never import an implementation; Node code injects one (see node/thread-pool.ts).
 */
export interface BlockParallelism {
	/** Number of threads that share the work (including the caller). */
	readonly threads: number;
	/** A zero-filled buffer every thread can read and write (SharedArrayBuffer-backed). */
	allocate(length: number): Float32Array;
	/** Run every block of the job and return when all are written; synchronous for the caller. */
	convolve(job: ConvolutionJob): void;
	/** Optional: a zero-filled Float64 buffer every thread can read and write, for {@link fft2}. */
	allocate64?(length: number): Float64Array;
	/**
	 * Optional: in-place 2-D DFT of a buffer from {@link allocate64} (interleaved complex, rows × cols),
	 * rows then columns, each pass split between the threads. Every line is transformed by the same
	 * code whichever thread runs it, so the bits equal those of the backend's own single-thread fft2.
	 */
	fft2?(data: Float64Array, rows: number, cols: number, inverse: boolean): void;
	/**
	 * Optional: run a row pass over buffers from {@link allocate64}, its rows split between the threads.
	 * Each row is computed by the same function on the same numbers whichever thread runs it.
	 */
	rows?(task: RowTask): void;
}

/**
 * Row passes of real transforms and of the Wiener filter that threads can share: every row k is
 * written by one thread from rows k and −k of buffers no thread writes during the pass.
 *   separate: half spectrum `out` from the packed transform `z` (real-fft.ts separateRows)
 *   pack: packed array `z` from the half spectrum `data` (real-fft.ts packRows)
 *   gain: half spectrum `data` times the Wiener gain of `otf` (wiener.ts wienerGainRows)
 *   decode: sRGB → linear light of a rows × cols plane in place (linear-light.ts decodeRange)
 *   finish: clip a plane to [0, 1] and, if `encode`, re-encode it to sRGB in place (restore.ts finishRange)
 */
export type RowTask =
	| { kind: 'separate'; z: Float64Array; rows: number; cols: number; out: Float64Array }
	| { kind: 'pack'; data: Float64Array; rows: number; cols: number; z: Float64Array }
	| { kind: 'gain'; data: Float64Array; otf: Float64Array; rows: number; cols: number; nsr: number; laplacian: boolean }
	| { kind: 'decode'; values: Float32Array; rows: number; cols: number }
	| { kind: 'finish'; values: Float32Array; rows: number; cols: number; encode: boolean };
