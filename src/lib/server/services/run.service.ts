/**
 * Rules for restoration runs as people ask for them: request, follow, cancel, replay, and fetch
 * results. The worker side (claiming and finishing a run) is in run-execution.service.ts.
 * Every state change commits together with its custody event; the queue is told afterwards,
 * so a job never points at a run that was rolled back.
 */
import type { Knex } from 'knex';
import type { Readable } from 'node:stream';
import { ENGINE_VERSION } from '../../imaging/version';
import { STAFF_ROLES, type SessionUser } from '../../roles';
import type { NewRun } from '../../schemas/run';
import type { Json } from '../canonical-json';
import type { Clock } from '../clock';
import { ConflictError, ForbiddenError, NotFoundError } from '../errors';
import { runRepository, type ReplaySummary, type RunRow } from '../repositories/run.repository';
import type { RunQueue } from '../run-queue';
import type { ObjectStorage } from '../storage';
import type { ViewThrottle } from '../view-throttle';
import { custodyService } from './custody.service';
import { visibleItem } from './item-access';

export interface RunView {
	id: number;
	itemId: number;
	caseId: number;
	requestedBy: { id: number; name: string };
	replayOf: number | null;
	method: RunRow['method'];
	psf: RunRow['psf'];
	params: RunRow['params'];
	engineVersion: string;
	status: RunRow['status'];
	progress: number;
	error: string | null;
	resultSha256: string | null;
	record: RunRow['record'];
	attempts: number;
	createdAt: Date;
	startedAt: Date | null;
	finishedAt: Date | null;
	/** On a replay: whether its result matched the replayed run's, bit for bit (null until known). */
	replayMatches: boolean | null;
	/** On a replayed run: its most recent replay. */
	latestReplay: ReplaySummary | null;
}

export interface StoredFile {
	body: Readable;
	size: number;
	filename: string;
	/** SHA-256 of exactly these bytes, when the ledger records it (the master). */
	sha256?: string;
}

export interface RunServiceDeps {
	clock: Clock;
	queue: RunQueue;
	storage: ObjectStorage;
	views: ViewThrottle;
}

const canRun = (user: SessionUser) => user.role === 'admin' || user.role === 'technician';
// Results reach a client only once released to them, and nothing is released yet.
const seesRuns = (user: SessionUser) => STAFF_ROLES.includes(user.role);

function view(run: RunRow, latestReplay: ReplaySummary | undefined): RunView {
	return {
		id: run.id,
		itemId: run.itemId,
		caseId: run.caseId,
		requestedBy: { id: run.requestedBy, name: run.requestedByName },
		replayOf: run.replayOf,
		method: run.method,
		psf: run.psf,
		params: run.params,
		engineVersion: run.engineVersion,
		status: run.status,
		progress: run.progress,
		error: run.error,
		resultSha256: run.resultSha256,
		record: run.record,
		attempts: run.attempts,
		createdAt: run.createdAt,
		startedAt: run.startedAt,
		finishedAt: run.finishedAt,
		replayMatches: run.replayMatches,
		latestReplay: latestReplay ?? null
	};
}

export function runService(knex: Knex, deps: RunServiceDeps) {
	const runs = runRepository(knex);
	const custody = custodyService(knex, deps.clock);
	const actorOf = (user: SessionUser) => ({ id: user.id, role: user.role });

	/** A run is visible to staff who see its item; to anyone else it does not exist. */
	async function visibleRun(user: SessionUser, runId: number): Promise<RunRow> {
		const run = await runs.findById(runId);
		if (!run || !seesRuns(user)) throw new NotFoundError('Run');
		await visibleItem(knex, user, run.itemId);
		return run;
	}

	function requireRunner(user: SessionUser): void {
		if (!canRun(user)) throw new ForbiddenError('Only technicians and administrators run restorations');
	}

	/**
	 * Insert a queued run with its custody event, then hand it to the queue. The answer is the run
	 * as accepted (queued): a fast worker may already be running it by the time the caller reads it.
	 */
	async function submit(user: SessionUser, row: Parameters<typeof runs.insert>[0], caseId: number, detail: Record<string, Json>): Promise<RunRow> {
		const id = await knex.transaction(async (trx) => {
			const runId = await runs.insert(row, trx);
			await custody.record({ action: 'run_requested', actor: actorOf(user), caseId, itemId: row.itemId, runId, detail }, trx);
			return runId;
		});
		const accepted = (await runs.findById(id))!;
		try {
			await deps.queue.enqueue(id);
		} catch (err) {
			// Without a job nothing would ever pick the run up: say so on the run rather than leave it queued forever.
			await fail(id, `The run could not be queued: ${(err as Error).message}`, caseId, row.itemId);
			throw err;
		}
		return accepted;
	}

	async function fail(runId: number, reason: string, caseId: number, itemId: number): Promise<void> {
		await knex.transaction(async (trx) => {
			if (!(await runs.fail(runId, null, reason, deps.clock.now(), trx))) return;
			await custody.record({ action: 'run_failed', actor: { id: null, role: 'system' }, caseId, itemId, runId, detail: { reason } }, trx);
		});
	}

	return {
		async create(user: SessionUser, itemId: number, input: NewRun): Promise<RunRow> {
			requireRunner(user);
			const item = await visibleItem(knex, user, itemId);
			const row = { itemId: item.id, requestedBy: user.id, replayOf: null, method: input.method, psf: input.psf, params: input.params, engineVersion: ENGINE_VERSION };
			return submit(user, row, item.caseId, {
				method: input.method,
				psf: input.psf as Json,
				params: input.params as Json,
				engineVersion: ENGINE_VERSION,
				originalSha256: item.sha256
			});
		},

		async get(user: SessionUser, runId: number): Promise<RunView> {
			const run = await visibleRun(user, runId);
			return view(run, await runs.latestReplayOf(run.id));
		},

		async listForItem(user: SessionUser, itemId: number): Promise<RunView[]> {
			const item = await visibleItem(knex, user, itemId);
			if (!seesRuns(user)) return [];
			const list = await runs.listForItem(item.id);
			return Promise.all(list.map(async (run) => view(run, await runs.latestReplayOf(run.id))));
		},

		/**
		 * Cancel a queued or running run. The row changes first: a worker holding the run sees the
		 * status on its next poll, stops between iterations and writes no result.
		 */
		async cancel(user: SessionUser, runId: number): Promise<RunView> {
			requireRunner(user);
			const run = await visibleRun(user, runId);
			const cancelled = await knex.transaction(async (trx) => {
				if (!(await runs.cancel(run.id, deps.clock.now(), trx))) return false;
				await custody.record(
					{ action: 'run_cancelled', actor: actorOf(user), caseId: run.caseId, itemId: run.itemId, runId: run.id, detail: { statusBefore: run.status, progress: run.progress } },
					trx
				);
				return true;
			});
			if (!cancelled) throw new ConflictError(`The run is already ${(await runs.findById(run.id))!.status} and cannot be cancelled`);
			await deps.queue.discard(run.id);
			return view((await runs.findById(run.id))!, await runs.latestReplayOf(run.id));
		},

		/** Run a succeeded run again from the original and its recorded settings; the worker compares the hashes. */
		async replay(user: SessionUser, runId: number): Promise<RunRow> {
			requireRunner(user);
			const original = await visibleRun(user, runId);
			if (original.status !== 'succeeded') throw new ConflictError('Only a succeeded run can be replayed');
			const row = { itemId: original.itemId, requestedBy: user.id, replayOf: original.id, method: original.method, psf: original.psf, params: original.params, engineVersion: ENGINE_VERSION };
			return submit(user, row, original.caseId, {
				replayOf: original.id,
				expectedSha256: original.resultSha256,
				originalEngineVersion: original.engineVersion,
				engineVersion: ENGINE_VERSION
			});
		},

		/** The 16-bit TIFF master; every download is a custody event (PREMIS "dissemination"). */
		async download(user: SessionUser, runId: number): Promise<StoredFile> {
			const run = await finished(user, runId);
			await custody.record({ action: 'result_downloaded', actor: actorOf(user), caseId: run.caseId, itemId: run.itemId, runId: run.id, detail: { file: 'master' }, hashAfter: run.resultSha256 });
			return open(run.resultKey!, `run-${run.id}-${run.resultSha256!.slice(0, 12)}.tif`, run.resultSha256!);
		},

		/** The PNG preview; views are logged once per user per run per window (see view-throttle.ts). */
		async preview(user: SessionUser, runId: number): Promise<StoredFile> {
			const run = await finished(user, runId);
			if (await deps.views.claim(user.id, run.id)) {
				try {
					await custody.record({ action: 'result_viewed', actor: actorOf(user), caseId: run.caseId, itemId: run.itemId, runId: run.id, detail: { file: 'preview' }, hashAfter: run.resultSha256 });
				} catch (err) {
					await deps.views.release(user.id, run.id);
					throw err;
				}
			}
			return open(run.previewKey!, `run-${run.id}-preview.png`);
		}
	};

	async function finished(user: SessionUser, runId: number): Promise<RunRow> {
		const run = await visibleRun(user, runId);
		if (run.status !== 'succeeded' || !run.resultKey || !run.previewKey) throw new NotFoundError('Result');
		return run;
	}

	async function open(key: string, filename: string, sha256?: string): Promise<StoredFile> {
		return { body: await deps.storage.read(key), size: await deps.storage.size(key), filename, ...(sha256 ? { sha256 } : {}) };
	}
}
