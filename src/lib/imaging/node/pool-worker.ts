/**
 * worker_threads entry of the block-convolution pool (thread-pool.ts). Each worker owns its own
 * PFFFT instance, computes the kernel's block spectrum with it (the same code and numbers as the
 * caller, so the same bits) and runs the pair range it is given, writing straight into the
 * SharedArrayBuffer-backed output; or it transforms its range of rows or columns of a shared 2-D
 * FFT. Completion is signalled through Atomics on a shared counter because the caller waits
 * synchronously.
 */
import { parentPort } from 'node:worker_threads';
import { loadPffftBackend } from '../fft/pffft-loader';
import { convolvePairs, kernelBlockSpectrum, type ConvolutionJob } from '../restoration/block-convolution';
import { runRowTask, type PoolTask } from './thread-pool';

const port = parentPort;
if (!port) throw new Error('pool-worker.ts must run inside worker_threads');
const backend = await loadPffftBackend();
port.on('message', (task: PoolTask) => {
	const control = task.control;
	try {
		if (task.kind === 'convolve') {
			const job: ConvolutionJob = task.job;
			convolvePairs(job, kernelBlockSpectrum(job, backend), backend, task.firstPair, task.endPair);
		} else if (task.kind === 'rows') {
			runRowTask(task.task, task.first, task.end);
		} else if (task.kind === 'fft-rows') {
			backend.transformRows(task.data, task.rows, task.cols, task.inverse, task.first, task.end);
		} else {
			backend.transformColumns(task.data, task.rows, task.cols, task.inverse, task.first, task.end);
		}
	} catch (error) {
		Atomics.store(control, 1, 1);
		process.stderr.write(`pool-worker: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}\n`);
	} finally {
		Atomics.sub(control, 0, 1);
		Atomics.notify(control, 0);
	}
});
port.postMessage('ready');
