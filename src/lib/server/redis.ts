/** The process's single Redis connection for app use (BullMQ keeps its own, see queue.ts). */
import { Redis } from 'ioredis';
import { config } from './config';

let instance: Redis | undefined;

export function redis(): Redis {
	instance ??= new Redis(config().REDIS_URL, { maxRetriesPerRequest: 3, lazyConnect: false });
	return instance;
}

export async function closeRedis(): Promise<void> {
	if (instance) {
		const closing = instance;
		instance = undefined;
		await closing.quit();
	}
}
