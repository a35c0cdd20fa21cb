/// <reference lib="webworker" />
/** The region preview off the main thread: one request in, one answer out (see region-restore.ts). */
import './worker-global';
import type { RegionRequest } from './region-preview';
import { previewRegion } from './region-restore';

self.onmessage = (event: MessageEvent<RegionRequest>) => {
	const answer = previewRegion(event.data);
	(self as unknown as DedicatedWorkerGlobalScope).postMessage(answer, answer.ok ? [answer.rgba.buffer] : []);
};
