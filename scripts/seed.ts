/**
 * `tsx scripts/seed.ts [--with-photo]`: load the demo scenario into the configured database and
 * list the logins. With --with-photo it also registers the blurred demo photo and queues its
 * restoration for the worker.
 */
import { closeDb, db } from '../src/lib/server/db';
import { closeQueue } from '../src/lib/server/queue';
import { closeRedis } from '../src/lib/server/redis';
import { seedDemo } from '../src/lib/server/demo/seed';
import { DEMO_USERS } from '../src/lib/server/demo/scenario';

seedDemo(db(), { withPhoto: process.argv.includes('--with-photo') })
	.then(({ usersAdded, casesAdded, restoration }) => {
		console.log(`demo data: ${usersAdded} users and ${casesAdded} cases added (existing ones kept)`);
		if (restoration) console.log(`demo photo: item ${restoration.itemId}, restoration run ${restoration.runId} queued for the worker`);
		console.log('demo sign-ins (local demo only):');
		for (const u of DEMO_USERS) console.log(`  ${u.role.padEnd(11)} ${u.email.padEnd(32)} ${u.password}`);
	})
	.catch((error: unknown) => {
		console.error(error instanceof Error ? error.message : error);
		process.exitCode = 1;
	})
	.finally(() => Promise.allSettled([closeDb(), closeQueue(), closeRedis()]));
