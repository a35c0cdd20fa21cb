/**
 * Node-only entry of the imaging engine: the PFFFT backend with a worker_threads pool. Kept out of
 * `../index.ts` so browser bundles never see `node:worker_threads`.
 */
import { availableParallelism } from 'node:os';
import type { PffftBackend } from '../fft/pffft-backend';
import { loadPffftBackend } from '../fft/pffft-loader';
import { NodeThreadPool } from './thread-pool';

export { NodeThreadPool, pairRange } from './thread-pool';

/** A ready backend and the function that stops its workers. */
export interface NodeFftBackend {
	backend: PffftBackend;
	close(): Promise<void>;
}

/**
 * PFFFT backend for Node whose block convolutions run on `threads` threads (the caller included).
 * Output bytes are the same for every thread count.
 * @param threads @default os.availableParallelism()
 * @throws RangeError unless 1 ≤ threads ≤ 64.
 */
export async function createNodeFftBackend(threads = availableParallelism()): Promise<NodeFftBackend> {
	const serial = await loadPffftBackend();
	const pool = await NodeThreadPool.start(threads, serial);
	return { backend: await loadPffftBackend({ parallel: pool }), close: () => pool.close() };
}
