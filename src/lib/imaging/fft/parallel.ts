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
}
