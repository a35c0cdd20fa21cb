/**
 * Decides which result views reach the custody ledger. A browser fetches a run's preview on every
 * render of the workbench and the case page, so logging each fetch would bury the events that
 * matter (requests, results, downloads) under identical lines. One `result_viewed` per user per
 * run per window still answers "who has looked at this result, and since when" — the question
 * a chain-of-custody record exists for (NIST sample chain-of-custody form: who handled the item
 * and when). Downloads are not throttled: each one is a copy leaving the system.
 * The window lives in Redis (SET NX EX) so every web process shares it.
 */
import type { Redis } from 'ioredis';

export interface ViewThrottle {
	/** True for the first view of this run by this user in the window (and claims the window). */
	claim(userId: number, runId: number): Promise<boolean>;
	/** Give the window back, when the custody write for a claimed view failed. */
	release(userId: number, runId: number): Promise<void>;
}

export const VIEW_WINDOW_SECONDS = 3600;

export function redisViewThrottle(store: Redis, prefix: string, windowSeconds = VIEW_WINDOW_SECONDS): ViewThrottle {
	const key = (userId: number, runId: number) => `${prefix}:result-viewed:${runId}:${userId}`;
	return {
		async claim(userId, runId) {
			return (await store.set(key(userId, runId), '1', 'EX', windowSeconds, 'NX')) === 'OK';
		},
		async release(userId, runId) {
			await store.del(key(userId, runId));
		}
	};
}
