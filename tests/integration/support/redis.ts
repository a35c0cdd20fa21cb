/** This suite's Redis keys (sign-in failure counters under the test server's prefix). */
import { Redis } from 'ioredis';
import { config } from '../../../src/lib/server/config';
import { queuePrefix } from './context';

/** Forget every failed sign-in the suite caused, so one file's refusals cannot block the next. */
export async function clearSignInFailures(): Promise<void> {
	const redis = new Redis(config().REDIS_URL, { maxRetriesPerRequest: 3 });
	try {
		const keys: string[] = [];
		const pattern = `${queuePrefix()}:signin-failures:*`;
		for await (const batch of redis.scanStream({ match: pattern, count: 500 })) keys.push(...(batch as string[]));
		if (keys.length) await redis.del(...keys);
	} finally {
		await redis.quit();
	}
}
