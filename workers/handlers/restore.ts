/**
 * The `restore` job: carry out one run. Claim it (a finished run is left alone, so a job
 * delivered again after a crash writes nothing twice), re-verify the original's SHA-256 from the
 * stored bytes, restore in a thread while reporting progress and watching for a cancel, store the
 * 16-bit TIFF master and PNG preview under their own SHA-256, and record the result.
 * Errors are rethrown so BullMQ records them and retries with backoff; the run row is updated
 * in `finally`.
 */
import { UnrecoverableError, type Job } from 'bullmq';
import { createHash } from 'node:crypto';
import { ENGINE_VERSION, type RestoreOptions } from '../../src/lib/imaging/index';
import type { KernelSpec } from '../../src/lib/imaging/kernels/spec';
import type { Json } from '../../src/lib/server/canonical-json';
import { systemClock } from '../../src/lib/server/clock';
import { config } from '../../src/lib/server/config';
import { db } from '../../src/lib/server/db';
import type { JOB, JobPayloads } from '../../src/lib/server/queue';
import type { ItemRow } from '../../src/lib/server/repositories/item.repository';
import { runExecutionService, type ClaimedRun } from '../../src/lib/server/services/run-execution.service';
import { storage, StorageNotFoundError } from '../../src/lib/server/storage';
import { throttledProgress } from '../restore/progress';
import { restoreInThread, type ThreadOutcome } from '../restore/run-in-thread';

export type RestoreJob = Job<JobPayloads[typeof JOB.restore]>;

export interface RestoreJobResult {
	runId: number;
	outcome: 'succeeded' | 'already finished' | 'stopped' | 'superseded';
	resultSha256?: string;
}

/** About four progress writes a second: smooth enough for a progress bar, light on the database. */
const PROGRESS_INTERVAL_MS = 250;

const sha256 = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');

export async function handleRestore(job: RestoreJob): Promise<RestoreJobResult> {
	const runId = job.data.runId;
	const execution = runExecutionService(db(), systemClock);
	const claimed = await execution.claim(runId);
	if (!claimed) return { runId, outcome: 'already finished' };

	let failure: unknown;
	try {
		return await carryOut(job, claimed, execution);
	} catch (err) {
		failure = err;
		throw err;
	} finally {
		if (failure !== undefined) {
			const final = failure instanceof UnrecoverableError || job.attemptsMade + 1 >= (job.opts.attempts ?? 1);
			// A failure to record the failure is logged; the job's own error is what BullMQ keeps.
			await execution
				.attemptFailed(claimed, (failure as Error).message, final)
				.catch((err: unknown) => console.error(`[worker ${process.pid}] run ${runId}: could not record the failure:`, err));
		}
	}
}

async function carryOut(job: RestoreJob, claimed: ClaimedRun, execution: ReturnType<typeof runExecutionService>): Promise<RestoreJobResult> {
	const { run, item } = claimed;
	if (run.engineVersion !== ENGINE_VERSION) {
		// A run is defined by its engine version: computing it with another would record a result it never had.
		throw new UnrecoverableError(`This worker runs ${ENGINE_VERSION}; the run was requested for ${run.engineVersion}`);
	}
	const original = await readOriginal(item);
	const actual = sha256(original);
	if (actual !== item.sha256) {
		await execution.fixityFailed(claimed, actual);
		throw new UnrecoverableError(`The original's SHA-256 does not match the intake record (expected ${item.sha256}, read ${actual})`);
	}
	if (!(await execution.started(claimed))) return { runId: run.id, outcome: 'superseded' };

	const logError = (err: unknown) => console.error(`[worker ${process.pid}] run ${run.id}: progress not saved:`, err);
	const report = throttledProgress((p) => Promise.all([execution.raiseProgress(claimed, p), job.updateProgress(p)]), PROGRESS_INTERVAL_MS, logError);
	const thread = restoreInThread(original, run.psf as unknown as KernelSpec, { method: run.method, ...run.params } as RestoreOptions, report);
	const poll = setInterval(() => {
		execution.holds(claimed).then((held) => held || thread.stop(), logError);
	}, config().RUN_CANCEL_POLL_MS);
	let outcome: ThreadOutcome;
	try {
		outcome = await thread.outcome;
	} finally {
		clearInterval(poll);
	}

	if (outcome.type === 'stopped') return { runId: run.id, outcome: 'stopped' };
	if (outcome.type === 'failed') throw outcome.retryable ? new Error(outcome.message) : new UnrecoverableError(outcome.message);
	// Cancelled while encoding: store nothing.
	if (!(await execution.holds(claimed))) return { runId: run.id, outcome: 'stopped' };

	const resultSha256 = sha256(outcome.master);
	const resultKey = `results/${resultSha256}.tif`;
	const previewKey = `previews/run-${resultSha256}.png`;
	// Keys are content addresses and objects write-once: a second worker storing the same bytes changes nothing.
	await storage().putBuffer(resultKey, Buffer.from(outcome.master), 'image/tiff');
	await storage().putBuffer(previewKey, Buffer.from(outcome.preview), 'image/png');
	const record = {
		...outcome.record,
		input: { itemId: item.id, sha256: item.sha256, decode: outcome.decode },
		output: { sha256: resultSha256, format: 'tiff', bitDepth: 16, compression: 'deflate', quantisation: outcome.quantisation }
	} as unknown as Json;
	const recorded = await execution.succeeded(claimed, { resultSha256, resultKey, previewKey, record });
	return { runId: run.id, outcome: recorded ? 'succeeded' : 'superseded', resultSha256 };
}

/**
 * The original's bytes, read once as a stream: the bytes hashed for the fixity check are the
 * bytes restored, so nothing can change between the check and the use.
 */
async function readOriginal(item: ItemRow): Promise<Buffer> {
	const chunks: Buffer[] = [];
	try {
		for await (const chunk of await storage().read(item.storageKey)) chunks.push(chunk as Buffer);
	} catch (err) {
		if (err instanceof StorageNotFoundError) throw new UnrecoverableError(`The original is missing from storage (${item.storageKey})`);
		throw err;
	}
	return Buffer.concat(chunks);
}
