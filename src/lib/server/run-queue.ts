/**
 * How runs reach the worker: one BullMQ job per run, named `run-<id>`. The fixed job id makes
 * enqueueing idempotent (BullMQ ignores an add whose id exists), so a retried request can never
 * start a run twice. The database row, not the job, is the truth about a run; the job only
 * says "look at run N".
 */
import { config } from './config';
import { JOB, jobQueue, type JobPayloads } from './queue';

export interface RunQueue {
	enqueue(runId: number): Promise<void>;
	/** Drop a run's job if no worker holds it; a held job stops on its own when it sees the cancel. */
	discard(runId: number): Promise<void>;
}

export const runJobId = (runId: number) => `run-${runId}`;

const DAY_SECONDS = 24 * 3600;

export function bullRunQueue(): RunQueue {
	return {
		async enqueue(runId) {
			const c = config();
			const payload: JobPayloads[typeof JOB.restore] = { runId };
			await jobQueue().add(JOB.restore, payload, {
				jobId: runJobId(runId),
				attempts: c.RUN_MAX_ATTEMPTS,
				backoff: { type: 'exponential', delay: c.RUN_BACKOFF_MS },
				// Finished jobs are kept a while for inspection; the run row keeps the outcome for good.
				removeOnComplete: { age: DAY_SECONDS },
				removeOnFail: { age: 7 * DAY_SECONDS }
			});
		},
		async discard(runId) {
			await jobQueue().remove(runJobId(runId));
		}
	};
}
