/** Helpers for the run tests: test photographs, upload, run requests and polling. */
import { createHash, randomBytes } from 'node:crypto';
import sharp from 'sharp';
import { expect } from 'vitest';
import { testDb } from './db';
import { readJson, type HttpClient } from './http';

export const sha256 = (bytes: Buffer | Uint8Array) => createHash('sha256').update(bytes).digest('hex');

/** The straight-motion kernel of the examples. */
export const LINE_9_30 = { kind: 'line', length: 9, angleDeg: 30 } as const;

export interface RunBody {
	id: number;
	itemId: number;
	status: 'queued' | 'running' | 'succeeded' | 'failed' | 'cancelled';
	progress: number;
	error: string | null;
	resultSha256: string | null;
	attempts: number;
	replayOf: number | null;
	replayMatches: boolean | null;
	latestReplay: { id: number; status: string; matches: boolean | null } | null;
	record: Record<string, unknown> | null;
	engineVersion: string;
}

/**
 * A grey 8-bit PNG: bars and a disc (edges for the deconvolution to sharpen) plus random noise,
 * so every test run's originals are new bytes to the shared storage folder.
 */
export async function testPhoto(side: number): Promise<Buffer> {
	const noise = randomBytes(side * side);
	const pixels = Buffer.alloc(side * side);
	for (let y = 0; y < side; y++) {
		for (let x = 0; x < side; x++) {
			const bar = Math.floor(x / 12) % 2 === 0 ? 60 : 190;
			const disc = (x - side / 2) ** 2 + (y - side / 2) ** 2 < (side / 5) ** 2 ? 40 : 0;
			pixels[y * side + x] = Math.min(255, bar + disc + (noise[y * side + x] % 9));
		}
	}
	return sharp(pixels, { raw: { width: side, height: side, channels: 1 } }).toColourspace('b-w').png().toBuffer();
}

/** Upload through the items API, as the browser's FormData does; returns the item. */
export async function uploadPhoto(client: HttpClient, caseId: number, bytes: Buffer): Promise<{ id: number; sha256: string }> {
	const form = new FormData();
	form.append('file', new Blob([new Uint8Array(bytes)], { type: 'image/png' }), 'photo.png');
	const response = await fetch(`${client.base}/api/cases/${caseId}/items`, {
		method: 'POST',
		headers: { origin: client.base, accept: 'application/json', cookie: client.cookieHeader() },
		body: form
	});
	const body = await readJson<{ id: number; sha256: string }>(response);
	expect(response.status, JSON.stringify(body)).toBe(201);
	return body;
}

export async function requestRun(client: HttpClient, itemId: number, body: unknown): Promise<number> {
	const response = await client.post(`/api/items/${itemId}/runs`, { json: body });
	const answer = await readJson<{ id: number; status: string }>(response);
	expect(response.status, JSON.stringify(answer)).toBe(202);
	expect(answer.status).toBe('queued');
	return answer.id;
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** Poll GET /api/runs/{id} until `done` holds; returns every body seen, in order. */
export async function pollRun(client: HttpClient, runId: number, done: (run: RunBody) => boolean, timeoutMs = 60_000, everyMs = 100): Promise<RunBody[]> {
	const seen: RunBody[] = [];
	const deadline = Date.now() + timeoutMs;
	for (;;) {
		const run = await client.getJson<RunBody>(`/api/runs/${runId}`);
		seen.push(run);
		if (done(run)) return seen;
		if (Date.now() > deadline) throw new Error(`run ${runId} still ${run.status} (progress ${run.progress}) after ${timeoutMs} ms: ${run.error ?? ''}`);
		await sleep(everyMs);
	}
}

export const finished = (run: RunBody) => ['succeeded', 'failed', 'cancelled'].includes(run.status);

/** A run's custody events, oldest first, straight from the ledger table. */
export async function runEvents(runId: number): Promise<{ id: number; action: string; detail: Record<string, unknown>; hashBefore: string | null; hashAfter: string | null }[]> {
	const rows = await testDb()('custody_events').select('id', 'action', 'detail', 'hash_before as hashBefore', 'hash_after as hashAfter').where('run_id', runId).orderBy('id');
	return rows.map((r) => ({ ...r, detail: typeof r.detail === 'string' ? JSON.parse(r.detail) : r.detail }));
}
