import type { PffftModule } from '@echogarden/pffft-wasm/simd';
import type { FftBackend } from './backend';
import type { BlockParallelism } from './parallel';
import { PffftBackend } from './pffft-backend';

/** Options of {@link loadPffftBackend}. */
export interface PffftLoadOptions {
	/**
	 * URL of `pffft.wasm` for bundled browser code (e.g. Vite's `…/dist/simd/pffft.wasm?url`).
	 * @default the file beside the package's own script (Node, unbundled ES modules)
	 */
	wasmUrl?: string;
	/** Backend for lengths PFFFT cannot transform. @default fft.js / ndarray-fft */
	fallback?: FftBackend;
	parallel?: BlockParallelism;
}

let module: Promise<PffftModule> | undefined;

/**
 * Instantiate PFFFT's WASM SIMD build once per thread (Node main thread, worker_threads, browser
 * Web Worker) and wrap it in a synchronous {@link PffftBackend}. Instantiation is asynchronous by
 * the WebAssembly API's design; everything after it is synchronous.
 * @throws when the runtime lacks WASM SIMD (Node ≥ 16.4, current browsers have it): the engine then
 *   fails rather than silently switching to a build whose results differ in the last bits.
 */
export async function loadPffftBackend(options: PffftLoadOptions = {}): Promise<PffftBackend> {
	const { wasmUrl } = options;
	module ??= import('@echogarden/pffft-wasm/simd').then(({ default: PFFFT }) => PFFFT(wasmUrl ? { locateFile: () => wasmUrl } : {}));
	return new PffftBackend(await module, options.fallback, options.parallel);
}
