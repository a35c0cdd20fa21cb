/**
 * The Stillpoint worker: one process (several may run) consuming the job queue. Handlers rethrow
 * so BullMQ records failures; the process closes its connections on SIGINT/SIGTERM.
 */
import { Worker, type Job } from 'bullmq';
import { systemClock } from '../src/lib/server/clock';
import { config } from '../src/lib/server/config';
import { closeDb, db } from '../src/lib/server/db';
import { closeQueue, JOB, QUEUE_NAME, queueConnection, type JobName } from '../src/lib/server/queue';
import { bullRunQueue } from '../src/lib/server/run-queue';
import { runExecutionService } from '../src/lib/server/services/run-execution.service';
import { handleHealth } from './handlers/health';
import { handleRestore, type RestoreJob } from './handlers/restore';
import { closeRestorationThreads, warmRestorationThreads } from './restore/run-in-thread';

const handlers: Record<JobName, (job: Job) => Promise<unknown>> = {
	[JOB.health]: handleHealth,
	[JOB.restore]: (job) => handleRestore(job as RestoreJob)
};

const c = config();
warmRestorationThreads(c.WORKER_CONCURRENCY);
const worker = new Worker(
	QUEUE_NAME,
	async (job) => {
		const handler = handlers[job.name as JobName];
		if (!handler) throw new Error(`No handler for job "${job.name}"`);
		return handler(job);
	},
	{
		connection: queueConnection(),
		prefix: c.QUEUE_PREFIX,
		concurrency: c.WORKER_CONCURRENCY,
		// A killed worker's job is taken up again once its lock lapses and a stalled check runs.
		lockDuration: c.WORKER_LOCK_MS,
		stalledInterval: c.WORKER_STALLED_INTERVAL_MS,
		maxStalledCount: c.WORKER_MAX_STALLED
	}
);

/**
 * The database, not Redis, is the record of which runs are owed: if Redis lost jobs (a flush, a
 * restart without persistence), every unfinished run is queued again. Adding a job id that
 * exists is ignored, so runs whose jobs survived are untouched.
 */
async function requeueUnfinishedRuns(): Promise<void> {
	const ids = await runExecutionService(db(), systemClock).unfinished();
	await Promise.all(ids.map((id) => bullRunQueue().enqueue(id)));
}

worker.on('ready', () => {
	console.log(`[worker ${process.pid}] ready on queue "${QUEUE_NAME}"`);
	requeueUnfinishedRuns().catch((err: unknown) => console.error(`[worker ${process.pid}] could not re-queue unfinished runs:`, err));
});
worker.on('failed', (job, err) => {
	console.error(`[worker ${process.pid}] job ${job?.id} (${job?.name}) failed: ${err.message}`);
	// A job that stalled too often fails without its handler running: mark its run failed here.
	// For failures the handler saw, the run is already final and this changes nothing.
	const exhausted = err.name === 'UnrecoverableError' || (job !== undefined && job.attemptsMade >= (job.opts.attempts ?? 1));
	if (job?.name === JOB.restore && exhausted) {
		const reason = `The queue gave up on the run: ${err.message}`;
		runExecutionService(db(), systemClock)
			.abandoned((job as RestoreJob).data.runId, reason)
			.catch((e: unknown) => console.error(`[worker ${process.pid}] could not mark run ${(job as RestoreJob).data.runId} failed:`, e));
	}
});

async function shutdown(signal: string): Promise<void> {
	console.log(`[worker ${process.pid}] ${signal}: finishing the current job and closing`);
	await worker.close();
	await closeRestorationThreads();
	await closeQueue();
	await closeDb();
	process.exit(0);
}
process.on('SIGINT', () => void shutdown('SIGINT'));
process.on('SIGTERM', () => void shutdown('SIGTERM'));
