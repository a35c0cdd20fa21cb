/// <reference lib="webworker" />
/** The region preview off the main thread: one request in, one answer out (see region-restore.ts). */
import './worker-global';
import type { RegionRequest } from './region-preview';
import { loadPreviewFft, previewRegion } from './region-restore';

// Loaded once, before the first request is answered; answers keep the order of the requests.
const fft = loadPreviewFft();

self.onmessage = async (event: MessageEvent<RegionRequest>) => {
	const answer = previewRegion(event.data, await fft);
	(self as unknown as DedicatedWorkerGlobalScope).postMessage(answer, answer.ok ? [answer.rgba.buffer] : []);
};
