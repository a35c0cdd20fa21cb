/**
 * Twenty runs requested at once by several users (issue 4 tests): every one is queued once,
 * processed once by one of several workers, and succeeds; none is lost or duplicated, runs with
 * equal inputs give equal bytes, and the custody ledger stays intact under concurrent appends.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { signIn } from './support/auth';
import { closeTestDb, idOf, testDb } from './support/db';
import type { HttpClient } from './support/http';
import { finished, LINE_9_30, pollRun, requestRun, runEvents, testPhoto, uploadPhoto } from './support/runs';
import { startWorker, type WorkerProcess } from './support/worker-process';

let technician: HttpClient;
let admin: HttpClient;
let workers: WorkerProcess[] = [];

beforeAll(async () => {
	[technician, admin] = await Promise.all([signIn('technician'), signIn('admin')]);
	workers = await Promise.all([startWorker({ WORKER_CONCURRENCY: '2' }), startWorker({ WORKER_CONCURRENCY: '2' })]);
});

afterAll(async () => {
	await Promise.all(workers.map((w) => w.stop()));
	await closeTestDb();
});

const SETTINGS = [
	{ method: 'wiener', psf: LINE_9_30, params: { nsr: 0.01 } },
	{ method: 'rl', psf: LINE_9_30, params: { iterations: 10 } }
];

describe('20 concurrent runs from several users', () => {
	test('all complete, once each, with nothing lost or duplicated', async () => {
		const caseId = await idOf('cases', { reference: 'OCA-1971-0108' });
		const items = [await uploadPhoto(technician, caseId, await testPhoto(96)), await uploadPhoto(admin, caseId, await testPhoto(96))];
		const requests = Array.from({ length: 20 }, (_, i) => ({
			user: i % 2 === 0 ? technician : admin,
			itemId: items[i % 4 < 2 ? 0 : 1].id,
			body: SETTINGS[Math.floor(i / 4) % 2]
		}));
		const ids = await Promise.all(requests.map((r) => requestRun(r.user, r.itemId, r.body)));
		expect(new Set(ids).size).toBe(20);

		const runs = await Promise.all(ids.map(async (id) => (await pollRun(technician, id, finished, 150_000, 250)).at(-1)!));
		for (const run of runs) expect(run.status, `run ${run.id}: ${run.error}`).toBe('succeeded');

		// Same original, same settings, same engine: the same bytes (the replay guarantee, in bulk).
		const byInput = new Map<string, Set<string>>();
		runs.forEach((run, i) => {
			const key = `${requests[i].itemId}:${requests[i].body.method}`;
			(byInput.get(key) ?? byInput.set(key, new Set()).get(key)!).add(run.resultSha256!);
		});
		expect([...byInput.values()].map((hashes) => hashes.size)).toEqual([1, 1, 1, 1]);

		const stored = await testDb()('runs').whereIn('item_id', items.map((i) => i.id)).count({ n: '*' }).first();
		expect(Number(stored!.n)).toBe(20);
		// On a loaded machine a worker may lose a job's lock and another take the run over; that is
		// allowed (each claim shows as a fixity check and a start), but it must still succeed once.
		for (const run of runs) {
			const actions = (await runEvents(run.id)).map((e) => e.action);
			const claims = Array.from({ length: run.attempts }, () => ['fixity_checked', 'run_started']).flat();
			expect(actions, `run ${run.id}`).toEqual(['run_requested', ...claims, 'run_succeeded']);
		}
		const verify = await technician.getJson<{ intact: boolean }>('/api/custody/verify');
		expect(verify.intact).toBe(true);
	}, 180_000);
});
