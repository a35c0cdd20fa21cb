/**
 * Restoration runs through the real server and real worker processes (issue 4 §3 and §5):
 * request → queue → worker → result, replay, cancel, a tampered original, roles and bad bodies.
 */
import { chmod, writeFile } from 'node:fs/promises';
import { resolve } from 'node:path';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { config } from '../../src/lib/server/config';
import { signIn } from './support/auth';
import { closeTestDb, idOf } from './support/db';
import { readJson, type ApiError, type HttpClient } from './support/http';
import { finished, LINE_9_30, pollRun, requestRun, runEvents, sha256, testPhoto, uploadPhoto, type RunBody } from './support/runs';
import { startWorker, type WorkerProcess } from './support/worker-process';

let technician: HttpClient;
let supervisor: HttpClient;
let client: HttpClient;
let itemId: number;
let workers: WorkerProcess[] = [];

beforeAll(async () => {
	[technician, supervisor, client] = await Promise.all([signIn('technician'), signIn('supervisor'), signIn('client')]);
	const caseId = await idOf('cases', { reference: 'QCEU-2026-0142' });
	itemId = (await uploadPhoto(technician, caseId, await testPhoto(256))).id;
	workers = await Promise.all([startWorker(), startWorker()]);
});

afterAll(async () => {
	await Promise.all(workers.map((w) => w.stop()));
	await closeTestDb();
});

async function download(path: string): Promise<{ response: Response; bytes: Buffer }> {
	const response = await technician.get(path, { accept: '*/*' });
	return { response, bytes: Buffer.from(await response.arrayBuffer()) };
}

/** Progress seen while polling must never fall, and a succeeded run ends at exactly 1. */
function expectMonotonicToOne(seen: RunBody[]): void {
	const progress = seen.map((r) => r.progress);
	for (let i = 1; i < progress.length; i++) expect(progress[i]).toBeGreaterThanOrEqual(progress[i - 1]);
	expect(progress.at(-1)).toBe(1);
	expect(progress.every((p) => p >= 0 && p <= 1)).toBe(true);
}

describe('a run from request to result', () => {
	let rlRunId: number;
	let rlResult: string;

	test.each([
		['wiener', { method: 'wiener', psf: LINE_9_30, params: { nsr: 0.01 } }],
		['rl', { method: 'rl', psf: LINE_9_30, params: { iterations: 60, stopping: { relativeChange: 0 } } }]
	])('%s: progress rises to 1, the result hash is recorded and matches the downloaded master', async (method, body) => {
		const runId = await requestRun(technician, itemId, body);
		const seen = await pollRun(technician, runId, finished, 60_000, 50);
		const run = seen.at(-1)!;
		expect(run.status, run.error ?? '').toBe('succeeded');
		expectMonotonicToOne(seen);
		if (method === 'rl') expect(seen.some((r) => r.progress > 0 && r.progress < 1), 'an intermediate progress value').toBe(true);
		expect(run.resultSha256).toMatch(/^[0-9a-f]{64}$/);
		expect(run.record).toMatchObject({ resolvedMethod: method, kernel: LINE_9_30, output: { sha256: run.resultSha256, bitDepth: 16 } });

		const master = await download(`/api/runs/${runId}/result`);
		expect(master.response.status).toBe(200);
		expect(master.response.headers.get('content-type')).toBe('image/tiff');
		expect(master.response.headers.get('content-disposition')).toMatch(/^attachment; filename="run-\d+-[0-9a-f]{12}\.tif"$/);
		// SHA-256 (FIPS 180-4) of the bytes served equals the hash recorded on the run and in the ledger.
		expect(sha256(master.bytes)).toBe(run.resultSha256);
		const meta = await sharp(master.bytes).metadata();
		expect([meta.format, meta.depth, meta.width, meta.height, meta.channels]).toEqual(['tiff', 'ushort', 256, 256, 1]);

		const events = await runEvents(runId);
		expect(events.map((e) => e.action)).toEqual(['run_requested', 'fixity_checked', 'run_started', 'run_succeeded', 'result_downloaded']);
		expect(events[1].detail).toMatchObject({ outcome: 'passed' });
		expect(events[3].hashAfter).toBe(run.resultSha256);
		if (method === 'rl') [rlRunId, rlResult] = [runId, run.resultSha256!];
	});

	test('the preview is a PNG, and repeated views make one custody event per user per hour', async () => {
		for (let i = 0; i < 3; i++) {
			const preview = await download(`/api/runs/${rlRunId}/preview`);
			expect(preview.response.status).toBe(200);
			expect(preview.response.headers.get('content-type')).toBe('image/png');
			expect((await sharp(preview.bytes).metadata()).format).toBe('png');
		}
		await supervisor.get(`/api/runs/${rlRunId}/preview`, { accept: '*/*' });
		const viewed = (await runEvents(rlRunId)).filter((e) => e.action === 'result_viewed');
		expect(viewed).toHaveLength(2);
	});

	test('a replay reproduces the result bit for bit, and says so on both runs and in the ledger', async () => {
		const response = await technician.post(`/api/runs/${rlRunId}/replay`);
		expect(response.status).toBe(202);
		const { id: replayId, replayOf } = await readJson<{ id: number; replayOf: number }>(response);
		expect(replayOf).toBe(rlRunId);
		const replay = (await pollRun(technician, replayId, finished)).at(-1)!;
		expect(replay.status, replay.error ?? '').toBe('succeeded');
		expect(replay.resultSha256).toBe(rlResult);
		expect(replay.replayMatches).toBe(true);
		const original = await technician.getJson<RunBody>(`/api/runs/${rlRunId}`);
		expect(original.latestReplay).toEqual({ id: replayId, status: 'succeeded', matches: true });
		const checked = (await runEvents(replayId)).find((e) => e.action === 'replay_checked');
		expect(checked).toMatchObject({ detail: { outcome: 'matches', replayOf: rlRunId }, hashBefore: rlResult, hashAfter: rlResult });
	});

	test('the item lists its runs, newest first', async () => {
		const { runs } = await supervisor.getJson<{ runs: RunBody[] }>(`/api/items/${itemId}/runs`);
		expect(runs.length).toBeGreaterThanOrEqual(3);
		expect(runs.every((r) => r.itemId === itemId)).toBe(true);
		expect(runs.map((r) => r.id)).toEqual([...runs.map((r) => r.id)].sort((a, b) => b - a));
	});
});

describe('cancel', () => {
	test('a running run stops between iterations, writes no result, and is logged once', async () => {
		const runId = await requestRun(technician, itemId, { method: 'rl', psf: LINE_9_30, params: { iterations: 500, stopping: { relativeChange: 0 } } });
		await pollRun(technician, runId, (r) => r.status === 'running' && r.progress > 0, 60_000, 50);
		const response = await technician.post(`/api/runs/${runId}/cancel`);
		expect(response.status).toBe(200);
		expect(await readJson<RunBody>(response)).toMatchObject({ id: runId, status: 'cancelled' });

		// Give the worker time to notice (poll every 200 ms here) and to write anything it wrongly would.
		await new Promise((r) => setTimeout(r, 2000));
		const run = await technician.getJson<RunBody>(`/api/runs/${runId}`);
		expect(run).toMatchObject({ status: 'cancelled', resultSha256: null });
		expect(run.progress).toBeLessThan(1);
		expect((await runEvents(runId)).map((e) => e.action)).toEqual(['run_requested', 'fixity_checked', 'run_started', 'run_cancelled']);
		expect((await technician.get(`/api/runs/${runId}/result`)).status).toBe(404);

		const again = await technician.post(`/api/runs/${runId}/cancel`);
		expect(again.status).toBe(409);
		expect((await readJson<ApiError>(again)).error).toMatch(/already cancelled/);
	});
});

describe('fixity', () => {
	test('a tampered original fails the run with the fixity reason, once, and is recorded', async () => {
		const caseId = await idOf('cases', { reference: 'OCA-1971-0108' });
		const item = await uploadPhoto(technician, caseId, await testPhoto(64));
		// Overwrite the stored original behind the storage layer's back (it keeps files read-only).
		const path = resolve(config().STORAGE_DIR, 'originals', item.sha256);
		const tampered = await testPhoto(64);
		await chmod(path, 0o644);
		await writeFile(path, tampered);
		await chmod(path, 0o444);

		const runId = await requestRun(technician, item.id, { method: 'wiener', psf: LINE_9_30 });
		const run = (await pollRun(technician, runId, finished)).at(-1)!;
		expect(run.status).toBe('failed');
		expect(run.error).toBe("original's SHA-256 does not match the intake record");
		expect(run.attempts).toBe(1); // not retried: the same bytes would fail the same way
		expect(run.resultSha256).toBeNull();
		const events = await runEvents(runId);
		expect(events.map((e) => e.action)).toEqual(['run_requested', 'fixity_checked', 'run_failed']);
		expect(events[1]).toMatchObject({ detail: { outcome: 'failed', algorithm: 'SHA-256' }, hashBefore: item.sha256, hashAfter: sha256(tampered) });
	});
});

describe('who may do what', () => {
	test('supervisors read runs but may not request, cancel or replay them', async () => {
		const { runs } = await supervisor.getJson<{ runs: RunBody[] }>(`/api/items/${itemId}/runs`);
		expect((await supervisor.post(`/api/items/${itemId}/runs`, { json: { method: 'auto', psf: LINE_9_30 } })).status).toBe(403);
		expect((await supervisor.post(`/api/runs/${runs[0].id}/cancel`)).status).toBe(403);
		expect((await supervisor.post(`/api/runs/${runs[0].id}/replay`)).status).toBe(403);
	});

	test('clients see no runs: nothing has been released to them', async () => {
		const { runs } = await technician.getJson<{ runs: RunBody[] }>(`/api/items/${itemId}/runs`);
		expect((await client.get(`/api/runs/${runs[0].id}`)).status).toBe(403);
		expect((await client.get(`/api/runs/${runs[0].id}/preview`)).status).toBe(403);
		expect((await client.get(`/api/items/${itemId}/runs`)).status).toBe(403);
	});

	test('unknown runs and items are 404; a replay of an unfinished run is 409', async () => {
		expect((await technician.get('/api/runs/999999')).status).toBe(404);
		expect((await technician.post('/api/items/999999/runs', { json: { method: 'auto', psf: LINE_9_30 } })).status).toBe(404);
		const { runs } = await technician.getJson<{ runs: RunBody[] }>(`/api/items/${itemId}/runs`);
		const cancelled = runs.find((r) => r.status === 'cancelled')!;
		const response = await technician.post(`/api/runs/${cancelled.id}/replay`);
		expect(response.status).toBe(409);
		expect((await readJson<ApiError>(response)).error).toBe('Only a succeeded run can be replayed');
	});
});

describe('bad bodies', () => {
	test.each([
		['no method', { psf: LINE_9_30 }, { method: ['method is one of wiener, rl, rltv, auto'] }],
		['an unknown kernel', { method: 'wiener', psf: { kind: 'blob' } }, { 'psf.kind': ['kernel kind must be one of line, path, disk, gaussian, image'] }],
		['a negative line length', { method: 'rl', psf: { kind: 'line', length: -3, angleDeg: 0 } }, { 'psf.length': ['line length must be positive'] }],
		['too many iterations', { method: 'rl', psf: LINE_9_30, params: { iterations: 501 } }, { 'params.iterations': ['iterations must be at most 500'] }],
		['zero iterations', { method: 'rltv', psf: LINE_9_30, params: { iterations: 0 } }, { 'params.iterations': ['iterations must be at least 1'] }],
		['a negative NSR', { method: 'wiener', psf: LINE_9_30, params: { nsr: -1 } }, { 'params.nsr': ['nsr must be ≥ 0'] }],
		['a TV weight at the stability bound', { method: 'rltv', psf: LINE_9_30, params: { tv: 0.25 } }, { 'params.tv': ['tv must be below 0.25'] }],
		['a setting the method ignores', { method: 'rl', psf: LINE_9_30, params: { nsr: 0.1 } }, { params: ['nsr does not apply to method rl'] }],
		['a non-boolean linearLight', { method: 'auto', psf: LINE_9_30, params: { linearLight: 'yes' } }, { 'params.linearLight': ['linearLight is true or false'] }]
	])('%s → 400 with the field message', async (_name, body, fields) => {
		const response = await technician.post(`/api/items/${itemId}/runs`, { json: body });
		expect(response.status).toBe(400);
		expect(await readJson<ApiError>(response)).toEqual({ error: 'Invalid input', fields });
	});

	test('malformed JSON → 400', async () => {
		const response = await technician.post(`/api/items/${itemId}/runs`, { body: '{"method":', contentType: 'application/json' });
		expect(response.status).toBe(400);
	});
});
