/**
 * A restoration thread, off the worker's main thread: the engine is synchronous and CPU-bound,
 * and on the main thread it would starve BullMQ's lock renewal (the job would look stalled and be
 * taken over) and the cancel poll. It takes one job at a time: decodes the original, restores it,
 * encodes the 16-bit TIFF master and the PNG preview, and posts them back. Nothing here touches
 * storage or the database.
 */
import { parentPort } from 'node:worker_threads';
import sharp from 'sharp';
import { loadPffftBackend, restore, setDefaultFftBackend } from '../../src/lib/imaging/index';
import { decodeImage } from '../../src/lib/server/imaging/decode';
import { encodePng, encodeTiff16 } from '../../src/lib/server/imaging/encode';
import { ImageInputError } from '../../src/lib/server/imaging/errors';
import { ownBuffer, type ThreadJob, type ThreadMessage } from './protocol';

// The WASM FFT (several times faster than the pure-JS one); the command line uses the same, so a
// run and a command-line restore with the same engine version agree byte for byte.
setDefaultFftBackend(await loadPffftBackend());

/** Long edge of the preview: enough for a screen, far smaller than a master. */
const PREVIEW_MAX_SIDE = 2048;

const post = (message: ThreadMessage, transfer: ArrayBufferLike[] = []) => parentPort!.postMessage(message, transfer as ArrayBuffer[]);

async function preview(bytes: Buffer): Promise<Buffer> {
	const meta = await sharp(bytes).metadata();
	if (Math.max(meta.width ?? 0, meta.height ?? 0) <= PREVIEW_MAX_SIDE) return bytes;
	return sharp(bytes).resize(PREVIEW_MAX_SIDE, PREVIEW_MAX_SIDE, { fit: 'inside' }).png({ compressionLevel: 9, adaptiveFiltering: false }).toBuffer();
}

async function restoreJob(input: ThreadJob, stop: Int32Array): Promise<void> {
	const controller = new AbortController();
	const { image, info } = await decodeImage(input.original);
	const result = restore(image, input.kernel, input.options, {
		signal: controller.signal,
		onProgress: (done, total) => {
			post({ type: 'progress', done, total });
			// The engine checks the signal before its next iteration.
			if (Atomics.load(stop, 0) === 1) controller.abort(new Error('stop requested'));
		}
	});
	if (Atomics.load(stop, 0) === 1) return post({ type: 'stopped' });
	const master = await encodeTiff16(result.image);
	const bytes = ownBuffer(master.bytes);
	const shown = ownBuffer(await preview((await encodePng(result.image, 8)).bytes));
	const message: ThreadMessage = { type: 'done', master: bytes, preview: shown, record: result.record, decode: info, quantisation: master.quantisation };
	post(message, [bytes.buffer, shown.buffer]);
}

parentPort!.on('message', (job: ThreadJob) => {
	const stop = new Int32Array(job.stop);
	restoreJob(job, stop).catch((err: unknown) => {
		if (Atomics.load(stop, 0) === 1) return post({ type: 'stopped' });
		// Unreadable images and invalid settings (RangeError from the engine) fail the same way every time.
		const retryable = !(err instanceof ImageInputError || err instanceof RangeError);
		post({ type: 'failed', message: err instanceof Error ? err.message : String(err), retryable });
	});
});
