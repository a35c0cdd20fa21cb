/**
 * The worker process really consumes the queue on the private Redis: a health job enqueued here
 * is answered by a separately started `workers/index.ts` process, and a job with no handler fails
 * and is recorded as failed (the worker rethrows instead of swallowing).
 */
import { QueueEvents } from 'bullmq';
import { spawn, type ChildProcess } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const PREFIX = `stillpoint_it_worker_${process.pid}`;
process.env.QUEUE_PREFIX = PREFIX;

const { closeQueue, jobQueue, queueConnection, QUEUE_NAME, JOB } = await import('../../src/lib/server/queue');
const { ENGINE_VERSION } = await import('../../src/lib/imaging/index');

let worker: ChildProcess;
let events: QueueEvents;

beforeAll(async () => {
	worker = spawn('npx', ['tsx', 'workers/index.ts'], {
		env: { ...process.env, QUEUE_PREFIX: PREFIX },
		stdio: ['ignore', 'pipe', 'pipe']
	});
	await new Promise<void>((resolve, reject) => {
		const timer = setTimeout(() => reject(new Error('worker did not report ready within 30 s')), 30_000);
		worker.stdout!.on('data', (chunk: Buffer) => {
			if (chunk.toString().includes('ready')) {
				clearTimeout(timer);
				resolve();
			}
		});
		worker.on('exit', (code) => reject(new Error(`worker exited early with ${code}`)));
	});
	events = new QueueEvents(QUEUE_NAME, { connection: queueConnection(), prefix: PREFIX });
	await events.waitUntilReady();
});

afterAll(async () => {
	worker?.kill('SIGTERM');
	await events?.close();
	await jobQueue().obliterate({ force: true });
	await closeQueue();
});

describe('worker process', () => {
	it('answers a health job with its pid and the engine version', async () => {
		const job = await jobQueue().add(JOB.health, { requestedAt: new Date().toISOString() });
		const result = await job.waitUntilFinished(events, 20_000);
		expect(result.pid).not.toBe(process.pid);
		expect(result.engine).toBe(ENGINE_VERSION);
		expect(Date.parse(result.answeredAt)).not.toBeNaN();
	});

	it('records a job it has no handler for as failed, with the reason', async () => {
		const job = await jobQueue().add('no-such-job', {}, { attempts: 1 });
		await expect(job.waitUntilFinished(events, 20_000)).rejects.toThrow(/No handler for job "no-such-job"/);
		expect(await job.getState()).toBe('failed');
	});
});
