/**
 * All SQL touching `runs`. A worker changes a run only while it holds it: every worker-side
 * UPDATE names the attempt number it claimed (`attempts = token`) as a fencing token, so a worker
 * that lost its job to another (a stalled lock, a crash it survived) can no longer write.
 */
import type { Knex } from 'knex';
import type { RunMethod, RunStatus } from '../../schemas/run';

export interface RunRow {
	id: number;
	itemId: number;
	caseId: number;
	requestedBy: number;
	requestedByName: string;
	replayOf: number | null;
	method: RunMethod;
	psf: Record<string, unknown>;
	params: Record<string, unknown>;
	engineVersion: string;
	status: RunStatus;
	progress: number;
	error: string | null;
	resultSha256: string | null;
	resultKey: string | null;
	previewKey: string | null;
	record: Record<string, unknown> | null;
	replayMatches: boolean | null;
	attempts: number;
	createdAt: Date;
	startedAt: Date | null;
	finishedAt: Date | null;
}

export interface NewRunRow {
	itemId: number;
	requestedBy: number;
	replayOf: number | null;
	method: RunMethod;
	psf: unknown;
	params: unknown;
	engineVersion: string;
}

export interface RunResult {
	resultSha256: string;
	resultKey: string;
	previewKey: string;
	record: unknown;
	replayMatches: boolean | null;
}

/** A run's latest replay, as shown on the replayed run. */
export interface ReplaySummary {
	id: number;
	status: RunStatus;
	matches: boolean | null;
}

const columns = [
	'r.id',
	'r.item_id as itemId',
	'i.case_id as caseId',
	'r.requested_by as requestedBy',
	'u.name as requestedByName',
	'r.replay_of as replayOf',
	'r.method',
	'r.psf',
	'r.params',
	'r.engine_version as engineVersion',
	'r.status',
	'r.progress',
	'r.error',
	'r.result_sha256 as resultSha256',
	'r.result_key as resultKey',
	'r.preview_key as previewKey',
	'r.record',
	'r.replay_matches as replayMatches',
	'r.attempts',
	'r.created_at as createdAt',
	'r.started_at as startedAt',
	'r.finished_at as finishedAt'
];

// MariaDB's JSON type is LONGTEXT underneath: values come back as strings.
const parseJson = (value: unknown) => (typeof value === 'string' ? JSON.parse(value) : (value ?? null));

function fromDb(row: Record<string, unknown>): RunRow {
	return {
		...(row as unknown as RunRow),
		progress: Number(row.progress),
		psf: parseJson(row.psf),
		params: parseJson(row.params),
		record: parseJson(row.record),
		replayMatches: row.replayMatches === null ? null : Boolean(row.replayMatches)
	};
}

const UNFINISHED: RunStatus[] = ['queued', 'running'];

export function runRepository(knex: Knex) {
	const select = (trx: Knex) =>
		trx('runs as r').join('items as i', 'i.id', 'r.item_id').join('users as u', 'u.id', 'r.requested_by').select(columns);
	const held = (trx: Knex, id: number, token: number) => trx('runs').where({ id, attempts: token, status: 'running' });

	return {
		async insert(run: NewRunRow, trx: Knex = knex): Promise<number> {
			const [id] = await trx('runs').insert({
				item_id: run.itemId,
				requested_by: run.requestedBy,
				replay_of: run.replayOf,
				method: run.method,
				psf: JSON.stringify(run.psf),
				params: JSON.stringify(run.params),
				engine_version: run.engineVersion
			});
			return id;
		},

		async findById(id: number, trx: Knex = knex): Promise<RunRow | undefined> {
			const row = await select(trx).where('r.id', id).first();
			return row ? fromDb(row) : undefined;
		},

		async listForItem(itemId: number, trx: Knex = knex): Promise<RunRow[]> {
			const rows = await select(trx).where('r.item_id', itemId).orderBy('r.id', 'desc');
			return rows.map(fromDb);
		},

		async latestReplayOf(id: number, trx: Knex = knex): Promise<ReplaySummary | undefined> {
			const row = await trx('runs')
				.select('id', 'status', 'replay_matches as matches')
				.where('replay_of', id)
				.orderBy('id', 'desc')
				.first();
			return row ? { id: row.id, status: row.status, matches: row.matches === null ? null : Boolean(row.matches) } : undefined;
		},

		async unfinishedIds(trx: Knex = knex): Promise<number[]> {
			return (await trx('runs').select('id').whereIn('status', UNFINISHED).orderBy('id')).map((r) => Number(r.id));
		},

		/** Cancel a run that has not finished; false when it already had. */
		async cancel(id: number, now: Date, trx: Knex = knex): Promise<boolean> {
			const changed = await trx('runs').where('id', id).whereIn('status', UNFINISHED).update({ status: 'cancelled', finished_at: now });
			return changed === 1;
		},

		/**
		 * Take a queued run, or one left running by a worker that died, for a new attempt; the new
		 * attempt number is the caller's fencing token. Undefined when the run has finished.
		 */
		async claim(id: number, now: Date, trx: Knex.Transaction): Promise<number | undefined> {
			const changed = await trx('runs')
				.where('id', id)
				.whereIn('status', UNFINISHED)
				.update({ status: 'running', attempts: trx.raw('attempts + 1'), started_at: now, progress: 0 });
			if (changed !== 1) return undefined;
			const row = await trx('runs').select('attempts').where('id', id).first();
			return Number(row.attempts);
		},

		/** Lock the run for the rest of `trx` if the token still holds it. */
		async lockIfHeld(id: number, token: number, trx: Knex.Transaction): Promise<boolean> {
			return (await held(trx, id, token).forUpdate().first('id')) !== undefined;
		},

		async isHeld(id: number, token: number, trx: Knex = knex): Promise<boolean> {
			return (await held(trx, id, token).first('id')) !== undefined;
		},

		/** Raise the progress; a lower value (a late write) never lowers it. */
		async raiseProgress(id: number, token: number, progress: number, trx: Knex = knex): Promise<void> {
			await held(trx, id, token).where('progress', '<', progress).update({ progress });
		},

		async succeed(id: number, token: number, result: RunResult, now: Date, trx: Knex): Promise<boolean> {
			const changed = await held(trx, id, token).update({
				status: 'succeeded',
				progress: 1,
				error: null,
				result_sha256: result.resultSha256,
				result_key: result.resultKey,
				preview_key: result.previewKey,
				record: JSON.stringify(result.record),
				replay_matches: result.replayMatches,
				finished_at: now
			});
			return changed === 1;
		},

		/** Put a failed attempt back in the queue's hands: the next attempt claims it again. */
		async requeue(id: number, token: number, error: string, trx: Knex = knex): Promise<boolean> {
			return (await held(trx, id, token).update({ status: 'queued', error })) === 1;
		},

		/** Fail the run if `token` still holds it; without a token, if it has not finished at all. */
		async fail(id: number, token: number | null, error: string, now: Date, trx: Knex): Promise<boolean> {
			const query = token === null ? trx('runs').where('id', id).whereIn('status', UNFINISHED) : held(trx, id, token);
			return (await query.update({ status: 'failed', error, finished_at: now })) === 1;
		}
	};
}
