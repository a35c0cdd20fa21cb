/// <reference lib="webworker" />
/** The spectrum panel's sums off the main thread: one request in, one answer out (see spectrum-view.ts). */
import './worker-global';
import { answerSpectrumRequest, type SpectrumRequest } from './spectrum-view';

self.onmessage = (event: MessageEvent<SpectrumRequest>) => {
	const answer = answerSpectrumRequest(event.data);
	const transfer = !answer.ok ? [] : answer.kind === 'spectrum' ? [answer.image.data.buffer] : [answer.overlay.lost.buffer];
	(self as unknown as DedicatedWorkerGlobalScope).postMessage(answer, transfer);
};
