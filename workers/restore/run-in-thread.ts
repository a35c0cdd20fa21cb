/**
 * Restoration threads (thread.ts) kept alive between jobs: loading the engine and sharp into a
 * fresh thread costs seconds, more than a small restoration takes. A thread runs one job at a
 * time; BullMQ's concurrency bounds how many are busy. A thread that dies is not reused.
 */
import { Worker } from 'node:worker_threads';
import type { RestoreOptions } from '../../src/lib/imaging/index';
import type { KernelSpec } from '../../src/lib/imaging/kernels/spec';
import { ownBuffer, type ThreadJob, type ThreadMessage } from './protocol';

export type ThreadOutcome = Exclude<ThreadMessage, { type: 'progress' }>;

export interface RestorationThread {
	outcome: Promise<ThreadOutcome>;
	/** Ask the thread to stop before its next iteration; it then reports `stopped`. */
	stop(): void;
}

const BOOT = new URL('./boot.mjs', import.meta.url);
const ENTRY = new URL('./thread.ts', import.meta.url).href;

const idle: Worker[] = [];

function spawnThread(): Worker {
	const thread = new Worker(BOOT, { workerData: { entry: ENTRY } });
	// Between jobs nothing listens for a thread's death, and an unheard 'error' would end the process.
	thread.on('error', (err) => console.error(`[worker ${process.pid}] restoration thread failed: ${err.message}`));
	thread.on('exit', () => idle.includes(thread) && idle.splice(idle.indexOf(thread), 1));
	thread.unref();
	return thread;
}

export function restoreInThread(
	original: Uint8Array,
	kernel: KernelSpec,
	options: RestoreOptions,
	onProgress: (done: number, total: number) => void
): RestorationThread {
	const stop = new SharedArrayBuffer(4);
	const bytes = ownBuffer(original);
	const thread = idle.pop() ?? spawnThread();

	const outcome = new Promise<ThreadOutcome>((resolve) => {
		const finish = (result: ThreadOutcome, reusable: boolean) => {
			thread.off('message', onMessage).off('error', onError).off('exit', onExit);
			if (reusable) idle.push(thread);
			else void thread.terminate();
			resolve(result);
		};
		const onMessage = (message: ThreadMessage) => {
			if (message.type === 'progress') onProgress(message.done, message.total);
			else finish(message, true);
		};
		// A thread that dies without reporting (out of memory, a module that fails to load) may do better on another try.
		const onError = (err: Error) => finish({ type: 'failed', message: `restoration thread crashed: ${err.message}`, retryable: true }, false);
		const onExit = (code: number) => finish({ type: 'failed', message: `restoration thread exited with code ${code}`, retryable: true }, false);
		thread.on('message', onMessage).on('error', onError).on('exit', onExit);
	});

	const job: ThreadJob = { original: bytes, kernel, options, stop };
	thread.postMessage(job, [bytes.buffer]);
	return { outcome, stop: () => Atomics.store(new Int32Array(stop), 0, 1) };
}

/** Start threads ahead of the first jobs, so the first run does not wait for the engine to load. */
export function warmRestorationThreads(count: number): void {
	while (idle.length < count) idle.push(spawnThread());
}

/** End the idle threads (at shutdown; busy ones end with their job). */
export async function closeRestorationThreads(): Promise<void> {
	await Promise.all(idle.splice(0).map((thread) => thread.terminate()));
}
