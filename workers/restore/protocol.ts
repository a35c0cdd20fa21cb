/** Messages between the worker's main thread and a restoration thread (structured-cloned). */
import type { RestoreOptions, RunRecord } from '../../src/lib/imaging/index';
import type { KernelSpec } from '../../src/lib/imaging/kernels/spec';
import type { DecodeInfo } from '../../src/lib/server/imaging/decode';
import type { QuantiseReport } from '../../src/lib/server/imaging/encode';

/** One restoration, posted to an idle thread. */
export interface ThreadJob {
	original: Uint8Array;
	kernel: KernelSpec;
	options: RestoreOptions;
	/** Int32 flag set to 1 by the main thread to ask for a stop between iterations. */
	stop: SharedArrayBuffer;
}

export type ThreadMessage =
	| { type: 'progress'; done: number; total: number }
	| { type: 'done'; master: Uint8Array; preview: Uint8Array; record: RunRecord; decode: DecodeInfo; quantisation: QuantiseReport }
	| { type: 'stopped' }
	/** `retryable` is false when the same input would fail the same way again. */
	| { type: 'failed'; message: string; retryable: boolean };

/**
 * The bytes in an ArrayBuffer of their own, so it can be transferred instead of copied; a small
 * Buffer may share Node's pool with unrelated data, and transferring that would detach it.
 */
export function ownBuffer(bytes: Uint8Array): Uint8Array<ArrayBuffer> {
	const whole = bytes.byteOffset === 0 && bytes.byteLength === bytes.buffer.byteLength && bytes.buffer instanceof ArrayBuffer;
	return whole ? (bytes as Uint8Array<ArrayBuffer>) : new Uint8Array(bytes);
}
