/**
 * A worker killed mid-run (issue 4 §3): the job's lock lapses, another worker takes it over,
 * and the run completes exactly once — one result, one run_succeeded — with its custody events
 * in order. Only this file's workers consume the queue while it runs (files run one at a time).
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { storage } from '../../src/lib/server/storage';
import { signIn } from './support/auth';
import { closeTestDb, idOf, testDb } from './support/db';
import type { HttpClient } from './support/http';
import { finished, LINE_9_30, pollRun, requestRun, runEvents, sha256, testPhoto, uploadPhoto } from './support/runs';
import { startWorker, type WorkerProcess } from './support/worker-process';

let technician: HttpClient;
const started: WorkerProcess[] = [];

beforeAll(async () => {
	technician = await signIn('technician');
});

afterAll(async () => {
	await Promise.all(started.map((w) => w.kill()));
	await closeTestDb();
});

describe('a worker killed in the middle of a run', () => {
	test('another worker completes the run exactly once, and the ledger tells it in order', async () => {
		const caseId = await idOf('cases', { reference: 'QCEU-2026-0142' });
		const item = await uploadPhoto(technician, caseId, await testPhoto(256));
		const first = await startWorker();
		started.push(first);

		const runId = await requestRun(technician, item.id, { method: 'rl', psf: LINE_9_30, params: { iterations: 400, stopping: { relativeChange: 0 } } });
		await pollRun(technician, runId, (r) => r.status === 'running' && r.progress >= 0.05, 60_000, 50);
		await first.kill();
		const killedAt = Date.now();
		const afterKill = await technician.getJson<{ status: string; progress: number }>(`/api/runs/${runId}`);
		expect(afterKill.status).toBe('running');
		expect(afterKill.progress).toBeLessThan(1);

		const second = await startWorker();
		started.push(second);
		const run = (await pollRun(technician, runId, finished, 120_000, 200)).at(-1)!;
		expect(run.status, run.error ?? '').toBe('succeeded');
		// Lock 8 s + stalled check every 2 s in the tests (WORKER_LOCK_MS, WORKER_STALLED_INTERVAL_MS).
		console.log(`run ${runId} finished ${Date.now() - killedAt} ms after the kill`);
		expect(run.attempts).toBe(2);

		const events = await runEvents(runId);
		expect(events.map((e) => e.action)).toEqual(['run_requested', 'fixity_checked', 'run_started', 'fixity_checked', 'run_started', 'run_succeeded']);
		expect(events.filter((e) => e.action === 'run_started').map((e) => e.detail.attempt)).toEqual([1, 2]);
		expect(events.at(-1)!.hashAfter).toBe(run.resultSha256);

		// One result: the run row names it, and the stored master's bytes hash to it.
		const row = await testDb()('runs').where('id', runId).first();
		expect(row.result_key).toBe(`results/${run.resultSha256}.tif`);
		expect(sha256(await storage().readBuffer(row.result_key))).toBe(run.resultSha256);
		expect(second.output()).not.toMatch(/failed/);
	}, 180_000);
});
