/**
 * Job names and payloads for the BullMQ queue shared by the web app and the worker.
 * Payloads carry ids only: the worker reads everything else from the database, so a job can
 * never act on stale or forged data.
 */
import { Queue, type ConnectionOptions } from 'bullmq';
import { config } from './config';

export const QUEUE_NAME = 'stillpoint';

export const JOB = {
	/** Round trip through the queue: proves a worker is connected and reports its versions. */
	health: 'health',
	/** Restore one run (new or replay): decode the original, deconvolve, store the result. */
	restore: 'restore'
} as const;

export interface JobPayloads {
	[JOB.health]: { requestedAt: string };
	[JOB.restore]: { runId: number };
}
export type JobName = keyof JobPayloads;

export interface HealthResult {
	worker: string;
	pid: number;
	engine: string;
	answeredAt: string;
}

/** BullMQ needs its own connections (blocking commands); build them from the same URL. */
export function queueConnection(): ConnectionOptions {
	const url = new URL(config().REDIS_URL);
	return {
		host: url.hostname,
		port: Number(url.port || 6379),
		db: Number(url.pathname.slice(1) || 0),
		password: url.password || undefined,
		maxRetriesPerRequest: null
	};
}

let queue: Queue | undefined;

export function jobQueue(): Queue {
	queue ??= new Queue(QUEUE_NAME, { connection: queueConnection(), prefix: config().QUEUE_PREFIX });
	return queue;
}

export async function closeQueue(): Promise<void> {
	if (queue) {
		const closing = queue;
		queue = undefined;
		await closing.close();
	}
}
