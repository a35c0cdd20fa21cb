/**
 * Rules for a worker carrying out a run. A worker first claims the run, which hands it a fencing
 * token (the attempt number); every later change is conditional on that token, and each custody
 * event commits in the same transaction as the change it reports. So when a job is delivered
 * twice (a worker killed mid-run, a lock that lapsed), only the holder of the latest claim can
 * write, and a run succeeds — and is logged as succeeded — at most once.
 */
import type { Knex } from 'knex';
import type { Json } from '../canonical-json';
import type { Clock } from '../clock';
import { itemRepository, type ItemRow } from '../repositories/item.repository';
import { runRepository, type RunRow } from '../repositories/run.repository';
import { custodyService, type CustodyEventInput } from './custody.service';

/** The worker acting on its own, as the ledger names it. */
const SYSTEM = { id: null, role: 'system' } as const;

export const FIXITY_FAILED = "original's SHA-256 does not match the intake record";

export interface ClaimedRun {
	run: RunRow;
	item: ItemRow;
	/** This attempt's fencing token. */
	token: number;
}

export interface FinishedResult {
	resultSha256: string;
	resultKey: string;
	previewKey: string;
	record: Json;
}

export function runExecutionService(knex: Knex, clock: Clock) {
	const runs = runRepository(knex);
	const items = itemRepository(knex);
	const custody = custodyService(knex, clock);

	const about = (c: ClaimedRun): Pick<CustodyEventInput, 'caseId' | 'itemId' | 'runId'> => ({
		caseId: c.item.caseId,
		itemId: c.item.id,
		runId: c.run.id
	});

	/** Run `write` in a transaction only while `token` still holds the run; false when it no longer does. */
	function whileHeld(c: ClaimedRun, write: (trx: Knex.Transaction) => Promise<void>): Promise<boolean> {
		return knex.transaction(async (trx) => {
			if (!(await runs.lockIfHeld(c.run.id, c.token, trx))) return false;
			await write(trx);
			return true;
		});
	}

	return {
		/** Claim a run for one attempt; undefined when it has finished (succeeded, failed or cancelled). */
		async claim(runId: number): Promise<ClaimedRun | undefined> {
			const token = await knex.transaction((trx) => runs.claim(runId, clock.now(), trx));
			if (token === undefined) return undefined;
			const run = (await runs.findById(runId))!;
			const item = (await items.findById(run.itemId))!;
			return { run, item, token };
		},

		/** Runs still queued or running, which must each have a job. */
		unfinished: () => runs.unfinishedIds(),

		/** Still ours: not cancelled, and no later attempt has claimed it. */
		holds: (c: ClaimedRun) => runs.isHeld(c.run.id, c.token),

		raiseProgress: (c: ClaimedRun, progress: number) => runs.raiseProgress(c.run.id, c.token, progress),

		/** The original's bytes hash as recorded at intake: log the fixity check, then the start. */
		started(c: ClaimedRun): Promise<boolean> {
			return whileHeld(c, async (trx) => {
				const check = { outcome: 'passed', algorithm: 'SHA-256', attempt: c.token };
				await custody.record({ action: 'fixity_checked', actor: SYSTEM, ...about(c), detail: check, hashBefore: c.item.sha256, hashAfter: c.item.sha256 }, trx);
				await custody.record({ action: 'run_started', actor: SYSTEM, ...about(c), detail: { attempt: c.token, engineVersion: c.run.engineVersion } }, trx);
			});
		},

		/** The original's bytes no longer match intake: the run fails for good, with the evidence. */
		fixityFailed(c: ClaimedRun, actualSha256: string): Promise<boolean> {
			return whileHeld(c, async (trx) => {
				await runs.fail(c.run.id, c.token, FIXITY_FAILED, clock.now(), trx);
				const check = { outcome: 'failed', algorithm: 'SHA-256', attempt: c.token };
				await custody.record({ action: 'fixity_checked', actor: SYSTEM, ...about(c), detail: check, hashBefore: c.item.sha256, hashAfter: actualSha256 }, trx);
				await custody.record({ action: 'run_failed', actor: SYSTEM, ...about(c), detail: { reason: FIXITY_FAILED } }, trx);
			});
		},

		/**
		 * Record the result. On a replay, compare its hash with the replayed run's: the same original,
		 * settings and engine version must give the same bytes.
		 */
		succeeded(c: ClaimedRun, result: FinishedResult): Promise<boolean> {
			return whileHeld(c, async (trx) => {
				const replayed = c.run.replayOf === null ? undefined : await runs.findById(c.run.replayOf, trx);
				const replayMatches = replayed ? replayed.resultSha256 === result.resultSha256 : null;
				await runs.succeed(c.run.id, c.token, { ...result, replayMatches }, clock.now(), trx);
				await custody.record(
					{ action: 'run_succeeded', actor: SYSTEM, ...about(c), detail: { resultKey: result.resultKey, previewKey: result.previewKey, engineVersion: c.run.engineVersion }, hashBefore: c.item.sha256, hashAfter: result.resultSha256 },
					trx
				);
				if (replayed) {
					const detail = { outcome: replayMatches ? 'matches' : 'differs', replayOf: replayed.id, expectedSha256: replayed.resultSha256, replayedEngineVersion: replayed.engineVersion, engineVersion: c.run.engineVersion };
					await custody.record({ action: 'replay_checked', actor: SYSTEM, ...about(c), detail, hashBefore: replayed.resultSha256, hashAfter: result.resultSha256 }, trx);
				}
			});
		},

		/**
		 * An attempt failed. On the last attempt the run fails with the reason; otherwise it goes back
		 * to queued with the reason shown while the queue waits to retry.
		 */
		attemptFailed(c: ClaimedRun, reason: string, final: boolean): Promise<boolean> {
			if (!final) return runs.requeue(c.run.id, c.token, `Attempt ${c.token} failed, retrying: ${reason}`);
			return whileHeld(c, async (trx) => {
				await runs.fail(c.run.id, c.token, reason, clock.now(), trx);
				await custody.record({ action: 'run_failed', actor: SYSTEM, ...about(c), detail: { reason, attempt: c.token } }, trx);
			});
		},

		/**
		 * The queue gave up on a run no worker could finish (e.g. it stalled too often, so no handler
		 * ran to record the failure): fail it unless it already finished.
		 */
		async abandoned(runId: number, reason: string): Promise<boolean> {
			return knex.transaction(async (trx) => {
				const run = await runs.findById(runId, trx);
				if (!run || !(await runs.fail(runId, null, reason, clock.now(), trx))) return false;
				await custody.record({ action: 'run_failed', actor: SYSTEM, caseId: run.caseId, itemId: run.itemId, runId, detail: { reason } }, trx);
				return true;
			});
		}
	};
}
