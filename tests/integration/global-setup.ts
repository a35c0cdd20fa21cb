/**
 * Integration suite set-up: a fresh database with the migrations and the demo scenario, this
 * suite's Redis keys cleared, and the BUILT app (`node build`) serving it on a loopback port.
 * Tests get the base URL and names through vitest's provide/inject (see support/context.ts).
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { cpSync, existsSync, rmSync } from 'node:fs';
import { resolve } from 'node:path';
import { Redis } from 'ioredis';
import type { TestProject } from 'vitest/node';
import { config } from '../../src/lib/server/config';
import { seedDemo } from '../../src/lib/server/demo/seed';
import { knexFor, recreateDatabase, serverKnex } from './support/db';
import type {} from './support/context';
import { migrationSource } from './support/migrations';

const HOST = '127.0.0.1';
const PORT = Number(process.env.IT_PORT ?? 4310);
const DATABASE_NAME = process.env.IT_DATABASE_NAME ?? 'stillpoint_it';
// Derived from the database, so two suites run side by side never touch each other's queue keys.
const QUEUE_PREFIX = DATABASE_NAME;
const SIGNIN_MAX_FAILURES = Number(process.env.SIGNIN_MAX_FAILURES ?? 5);
const BUILD_DIR = resolve('build');
// The server runs from a copy, so a rebuild during the run (another terminal) cannot pull chunks
// from under it. Inside the checkout, so the copy still resolves the project's node_modules.
const BUILD_COPY = resolve(`.data/integration-build-${PORT}`);

async function prepareDatabase(): Promise<void> {
	const server = serverKnex();
	try {
		await recreateDatabase(server, DATABASE_NAME);
	} finally {
		await server.destroy();
	}
	const knex = knexFor(DATABASE_NAME);
	try {
		await knex.migrate.latest({ migrationSource });
		await seedDemo(knex);
	} finally {
		await knex.destroy();
	}
}

/** Delete only this suite's keys (sign-in failure counters), never the developer's. */
async function flushSuiteKeys(): Promise<void> {
	const redis = new Redis(config().REDIS_URL, { maxRetriesPerRequest: 3 });
	try {
		const keys: string[] = [];
		for await (const batch of redis.scanStream({ match: `${QUEUE_PREFIX}:*`, count: 500 })) keys.push(...(batch as string[]));
		if (keys.length) await redis.del(...keys);
	} finally {
		await redis.quit();
	}
}

async function answers(baseURL: string): Promise<boolean> {
	try {
		await fetch(`${baseURL}/signin`, { redirect: 'manual' });
		return true;
	} catch {
		return false;
	}
}

async function startServer(baseURL: string): Promise<ChildProcess> {
	if (!existsSync(resolve(BUILD_DIR, 'index.js')) || !existsSync(resolve(BUILD_DIR, 'handler.js'))) {
		throw new Error(`${BUILD_DIR} is missing or incomplete: build the app first (\`npx vite build\`); the integration suite tests the built server.`);
	}
	rmSync(BUILD_COPY, { recursive: true, force: true });
	cpSync(BUILD_DIR, BUILD_COPY, { recursive: true });
	if (await answers(baseURL)) {
		throw new Error(`Something already listens on ${baseURL} (a leftover test server?); stop it or set IT_PORT.`);
	}
	const server = spawn(process.execPath, [BUILD_COPY], {
		env: {
			...process.env,
			NODE_ENV: 'production',
			HOST,
			PORT: String(PORT),
			ORIGIN: baseURL,
			AUTH_SECRET: `integration-tests-only-${randomBytes(24).toString('hex')}`,
			DATABASE_NAME,
			QUEUE_PREFIX,
			SIGNIN_MAX_FAILURES: String(SIGNIN_MAX_FAILURES),
			BODY_SIZE_LIMIT: '210M' // above UPLOAD_MAX_BYTES (200 MiB); adapter-node's default is 512K
		},
		stdio: ['ignore', 'pipe', 'pipe']
	});
	let output = '';
	const keep = (chunk: Buffer) => {
		output += chunk.toString();
		// Server-side errors (5xx stack traces) belong in the test log, where a failing test is read.
		process.stderr.write(chunk.toString().replace(/^/gm, '[test server] '));
	};
	server.stdout!.on('data', (chunk: Buffer) => (output += chunk.toString()));
	server.stderr!.on('data', keep);

	const deadline = Date.now() + 30_000;
	while (Date.now() < deadline) {
		if (server.exitCode !== null) {
			throw new Error(`The test server exited with code ${server.exitCode} before answering:\n${output}`);
		}
		try {
			const response = await fetch(`${baseURL}/signin`, { redirect: 'manual' });
			if (response.status === 200) return server;
		} catch {
			// not listening yet
		}
		await new Promise((r) => setTimeout(r, 200));
	}
	server.kill('SIGTERM');
	throw new Error(`The test server did not answer GET ${baseURL}/signin with 200 within 30 s:\n${output}`);
}

async function stopServer(server: ChildProcess): Promise<void> {
	if (server.exitCode !== null) return;
	const exited = new Promise<void>((r) => server.once('exit', () => r()));
	server.kill('SIGTERM');
	const timeout = setTimeout(() => server.kill('SIGKILL'), 5_000);
	await exited;
	clearTimeout(timeout);
}

export default async function setup(project: TestProject): Promise<() => Promise<void>> {
	const baseURL = `http://${HOST}:${PORT}`;
	// Test files that reach config() directly (db(), redis()) use the suite's database and keys too.
	process.env.DATABASE_NAME = DATABASE_NAME;
	process.env.QUEUE_PREFIX = QUEUE_PREFIX;
	// Its own storage and mailbox, emptied per run, so a demo's files are never touched.
	process.env.STORAGE_DIR = resolve(`.data/it-storage-${PORT}`);
	process.env.DEV_MAILBOX_DIR = resolve(`.data/it-mailbox-${PORT}`);
	for (const dir of [process.env.STORAGE_DIR, process.env.DEV_MAILBOX_DIR]) rmSync(dir, { recursive: true, force: true });
	await prepareDatabase();
	await flushSuiteKeys();
	const server = await startServer(baseURL);
	// If vitest exits without running the teardown (a crash, Ctrl-C), the server must not outlive it.
	const killOnExit = () => server.kill('SIGKILL');
	process.once('exit', killOnExit);

	project.provide('baseURL', baseURL);
	project.provide('databaseName', DATABASE_NAME);
	project.provide('queuePrefix', QUEUE_PREFIX);
	project.provide('signInMaxFailures', SIGNIN_MAX_FAILURES);

	return async () => {
		process.off('exit', killOnExit);
		await stopServer(server);
		rmSync(BUILD_COPY, { recursive: true, force: true });
	};
}
