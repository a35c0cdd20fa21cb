/**
 * Real worker processes for the integration suite, on the test server's database and queue
 * prefix. Started as `node --import tsx` (not through npx or the tsx CLI, which put a parent
 * process in between) so the pid is the worker's own and SIGKILL really kills it.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { databaseName, queuePrefix } from './context';

/**
 * Short lock and stalled-check intervals, so a killed worker's job is taken over within seconds
 * rather than the production ~25 s; a short backoff keeps retried runs quick.
 */
export const TEST_WORKER_ENV = {
	WORKER_LOCK_MS: '8000',
	WORKER_STALLED_INTERVAL_MS: '2000',
	RUN_BACKOFF_MS: '500',
	RUN_CANCEL_POLL_MS: '200'
};

export interface WorkerProcess {
	pid: number;
	child: ChildProcess;
	output(): string;
	/** SIGTERM and wait for the exit (the worker finishes its current job first). */
	stop(): Promise<void>;
	/** SIGKILL: the process dies mid-job, leaving its lock to lapse. */
	kill(): Promise<void>;
}

export async function startWorker(env: Record<string, string> = {}): Promise<WorkerProcess> {
	const child = spawn(process.execPath, ['--import', 'tsx', 'workers/index.ts'], {
		env: { ...process.env, DATABASE_NAME: databaseName(), QUEUE_PREFIX: queuePrefix(), ...TEST_WORKER_ENV, ...env },
		stdio: ['ignore', 'pipe', 'pipe']
	});
	let output = '';
	const keep = (chunk: Buffer) => (output += chunk.toString());
	child.stdout!.on('data', keep);
	child.stderr!.on('data', keep);
	const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));

	await new Promise<void>((resolve, reject) => {
		const timer = setTimeout(() => reject(new Error(`worker did not report ready within 60 s:\n${output}`)), 60_000);
		const onData = () => {
			if (output.includes('ready')) {
				clearTimeout(timer);
				child.stdout!.off('data', onData);
				resolve();
			}
		};
		child.stdout!.on('data', onData);
		child.once('exit', (code) => {
			clearTimeout(timer);
			reject(new Error(`worker exited early with ${code}:\n${output}`));
		});
	});

	const end = async (signal: NodeJS.Signals) => {
		if (child.exitCode === null && child.signalCode === null) child.kill(signal);
		await exited;
	};
	return { pid: child.pid!, child, output: () => output, stop: () => end('SIGTERM'), kill: () => end('SIGKILL') };
}
