/**
 * Turns the engine's per-iteration callbacks into at most one write per interval, never lower
 * than the last value written: the database and the queue see a monotonic progress in [0, 1]
 * at about four updates a second, however fast the iterations come.
 */
export interface ProgressSink {
	(fraction: number): Promise<unknown>;
}

export function throttledProgress(sink: ProgressSink, intervalMs: number, onError: (err: unknown) => void, now: () => number = Date.now) {
	let written = 0;
	let lastAt = -Infinity;
	return (done: number, total: number): void => {
		const fraction = Math.min(1, Math.max(0, done / Math.max(total, 1)));
		if (fraction <= written || now() - lastAt < intervalMs) return;
		written = fraction;
		lastAt = now();
		sink(fraction).catch(onError);
	};
}
