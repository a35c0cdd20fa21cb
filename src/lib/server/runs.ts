/** The run service wired to this process's database, queue, storage and Redis. */
import { systemClock } from './clock';
import { config } from './config';
import { db } from './db';
import { redis } from './redis';
import { bullRunQueue } from './run-queue';
import { runService } from './services/run.service';
import { storage } from './storage';
import { redisViewThrottle } from './view-throttle';

export function runs() {
	return runService(db(), {
		clock: systemClock,
		queue: bullRunQueue(),
		storage: storage(),
		views: redisViewThrottle(redis(), config().QUEUE_PREFIX)
	});
}
