import { Worker } from 'node:worker_threads';
import type { FftBackend } from '../fft/backend';
import type { BlockParallelism } from '../fft/parallel';
import { convolvePairs, kernelBlockSpectrum, tileLayout, type ConvolutionJob } from '../restoration/block-convolution';

/** One thread's share of a convolution, as posted to a worker. */
export interface PoolTask {
	job: ConvolutionJob;
	firstPair: number;
	endPair: number;
	/** [workers still running, error flag], SharedArrayBuffer-backed. */
	control: Int32Array;
}

/** Longest a caller waits for a worker between checks (ms); the loop only guards against lost wake-ups. */
const WAIT_SLICE_MS = 1000;

/**
 * Pair range of thread `t` among `threads`: a FIXED contiguous partition of the job's tile pairs.
 * Every pair is computed by the same code on the same inputs whichever thread runs it, so the output
 * bytes do not depend on the thread count (tested).
 */
export function pairRange(pairs: number, t: number, threads: number): [number, number] {
	return [Math.floor((t * pairs) / threads), Math.floor(((t + 1) * pairs) / threads)];
}

/**
 * Node-only {@link BlockParallelism}: the calling thread plus `threads − 1` worker_threads share each
 * block convolution; buffers are SharedArrayBuffers, so no image data is copied between threads.
 * `convolve` is synchronous for the caller (it blocks in Atomics.wait), matching the engine's
 * synchronous API. The pure core never imports this file; Node entry points inject it.
 */
export class NodeThreadPool implements BlockParallelism {
	private constructor(
		private readonly workers: Worker[],
		private readonly backend: FftBackend
	) {}

	get threads(): number {
		return this.workers.length + 1;
	}

	/**
	 * Start `threads − 1` workers, each loading its own PFFFT instance, and resolve when all are ready.
	 * @param backend the caller's own backend: the same kind as the workers' (PFFFT), so all threads
	 *   compute identical bits.
	 * @throws RangeError unless 1 ≤ threads ≤ 64.
	 */
	static async start(threads: number, backend: FftBackend): Promise<NodeThreadPool> {
		if (!Number.isInteger(threads) || threads < 1 || threads > 64) throw new RangeError(`threads must be an integer in [1, 64], got ${threads}`);
		const workers = Array.from({ length: threads - 1 }, () => new Worker(new URL('./pool-worker-bootstrap.mjs', import.meta.url)));
		await Promise.all(
			workers.map(
				(w) =>
					new Promise<void>((resolve, reject) => {
						w.once('message', () => resolve());
						w.once('error', reject);
					})
			)
		);
		for (const w of workers) w.unref();
		return new NodeThreadPool(workers, backend);
	}

	allocate(length: number): Float32Array {
		return new Float32Array(new SharedArrayBuffer(4 * length));
	}

	convolve(job: ConvolutionJob): void {
		const { pairs } = tileLayout(job);
		const threads = this.threads;
		const control = new Int32Array(new SharedArrayBuffer(8));
		control[0] = threads - 1;
		this.workers.forEach((w, i) => {
			const [firstPair, endPair] = pairRange(pairs, i + 1, threads);
			w.postMessage({ job, firstPair, endPair, control } satisfies PoolTask);
		});
		const [firstPair, endPair] = pairRange(pairs, 0, threads);
		convolvePairs(job, kernelBlockSpectrum(job, this.backend), this.backend, firstPair, endPair);
		for (let left = Atomics.load(control, 0); left > 0; left = Atomics.load(control, 0)) Atomics.wait(control, 0, left, WAIT_SLICE_MS);
		if (control[1] !== 0) throw new Error('a convolution worker failed (its error is on stderr)');
	}

	/** Stop the workers; the pool cannot be used afterwards. */
	async close(): Promise<void> {
		await Promise.all(this.workers.map((w) => w.terminate()));
	}
}
