/** The `health` job: proves a worker is connected and reports which engine it runs. */
import { hostname } from 'node:os';
import { ENGINE_VERSION } from '../../src/lib/imaging/index';
import type { HealthResult } from '../../src/lib/server/queue';

export async function handleHealth(): Promise<HealthResult> {
	return { worker: hostname(), pid: process.pid, engine: ENGINE_VERSION, answeredAt: new Date().toISOString() };
}
