import { Worker } from 'node:worker_threads';
import type { BlockParallelism, RowTask } from '../fft/parallel';
import type { PffftBackend } from '../fft/pffft-backend';
import { packRows, separateRows } from '../fft/real-fft';
import { decodeRange } from '../restoration/linear-light';
import { finishRange } from '../restoration/restore';
import { wienerGainRows } from '../restoration/wiener';
import { convolvePairs, kernelBlockSpectrum, tileLayout, type ConvolutionJob } from '../restoration/block-convolution';

/** One thread's share of a convolution or of one pass of a 2-D FFT, as posted to a worker. */
export type PoolTask =
	| {
			kind: 'convolve';
			job: ConvolutionJob;
			firstPair: number;
			endPair: number;
			/** [workers still running, error flag], SharedArrayBuffer-backed. */
			control: Int32Array;
	  }
	| {
			kind: 'fft-rows' | 'fft-columns';
			/** SharedArrayBuffer-backed interleaved complex rows × cols. */
			data: Float64Array;
			rows: number;
			cols: number;
			inverse: boolean;
			/** Lines [first, end) of the pass. */
			first: number;
			end: number;
			control: Int32Array;
	  }
	| { kind: 'rows'; task: RowTask; first: number; end: number; control: Int32Array };

/** Rows [first, end) of a row pass; the same function the single-thread path runs over all rows. */
export function runRowTask(task: RowTask, first: number, end: number): void {
	if (task.kind === 'separate') separateRows(task.z, task.rows, task.cols, task.out, first, end);
	else if (task.kind === 'pack') packRows(task.data, task.rows, task.cols, task.z, first, end);
	else if (task.kind === 'gain') wienerGainRows(task.data, task.otf, task.rows, task.cols, task.nsr, task.laplacian, first, end);
	else if (task.kind === 'decode') decodeRange(task.values, task.values, first * task.cols, end * task.cols);
	else finishRange(task.values, task.encode, first * task.cols, end * task.cols);
}

/** Columns are handed out in multiples of this (the column pass gathers 32 at a time, pffft-backend.ts). */
const COLUMN_GRAIN = 32;

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
		private readonly backend: PffftBackend
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
	static async start(threads: number, backend: PffftBackend): Promise<NodeThreadPool> {
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

	allocate64(length: number): Float64Array {
		return new Float64Array(new SharedArrayBuffer(8 * length));
	}

	convolve(job: ConvolutionJob): void {
		const { pairs } = tileLayout(job);
		const threads = this.threads;
		const control = this.control();
		this.workers.forEach((w, i) => {
			const [firstPair, endPair] = pairRange(pairs, i + 1, threads);
			w.postMessage({ kind: 'convolve', job, firstPair, endPair, control } satisfies PoolTask);
		});
		const [firstPair, endPair] = pairRange(pairs, 0, threads);
		convolvePairs(job, kernelBlockSpectrum(job, this.backend), this.backend, firstPair, endPair);
		this.wait(control);
	}

	/**
	 * Row pass split into contiguous row ranges, then (after every thread is done) the column pass
	 * split into ranges of whole 32-column groups; each thread runs PffftBackend's own line passes.
	 */
	fft2(data: Float64Array, rows: number, cols: number, inverse: boolean): void {
		const threads = this.threads;
		for (const kind of ['fft-rows', 'fft-columns'] as const) {
			const lines = kind === 'fft-rows' ? rows : cols;
			const grain = kind === 'fft-rows' ? 1 : COLUMN_GRAIN;
			const units = Math.ceil(lines / grain);
			const range = (t: number): [number, number] => {
				const [a, b] = pairRange(units, t, threads);
				return [Math.min(lines, a * grain), Math.min(lines, b * grain)];
			};
			const control = this.control();
			this.workers.forEach((w, i) => {
				const [first, end] = range(i + 1);
				w.postMessage({ kind, data, rows, cols, inverse, first, end, control } satisfies PoolTask);
			});
			const [first, end] = range(0);
			if (kind === 'fft-rows') this.backend.transformRows(data, rows, cols, inverse, first, end);
			else this.backend.transformColumns(data, rows, cols, inverse, first, end);
			this.wait(control);
		}
	}

	/** Contiguous row ranges of a row pass, one per thread (a fixed partition, like the tile pairs). */
	rows(task: RowTask): void {
		const threads = this.threads;
		const control = this.control();
		this.workers.forEach((w, i) => {
			const [first, end] = pairRange(task.rows, i + 1, threads);
			w.postMessage({ kind: 'rows', task, first, end, control } satisfies PoolTask);
		});
		const [first, end] = pairRange(task.rows, 0, threads);
		runRowTask(task, first, end);
		this.wait(control);
	}

	/** [workers still running, error flag] for one hand-over. */
	private control(): Int32Array {
		const control = new Int32Array(new SharedArrayBuffer(8));
		control[0] = this.workers.length;
		return control;
	}

	/** Block until every worker has finished its share; rethrow a worker's failure. */
	private wait(control: Int32Array): void {
		for (let left = Atomics.load(control, 0); left > 0; left = Atomics.load(control, 0)) Atomics.wait(control, 0, left, WAIT_SLICE_MS);
		if (control[1] !== 0) throw new Error('a pool worker failed (its error is on stderr)');
	}

	/** Stop the workers; the pool cannot be used afterwards. */
	async close(): Promise<void> {
		await Promise.all(this.workers.map((w) => w.terminate()));
	}
}
