/** `tsx scripts/seed.ts`: load the demo scenario into the configured database and list the logins. */
import { closeDb, db } from '../src/lib/server/db';
import { seedDemo } from '../src/lib/server/demo/seed';
import { DEMO_USERS } from '../src/lib/server/demo/scenario';

seedDemo(db())
	.then(({ usersAdded, casesAdded }) => {
		console.log(`demo data: ${usersAdded} users and ${casesAdded} cases added (existing ones kept)`);
		console.log('demo sign-ins (local demo only):');
		for (const u of DEMO_USERS) console.log(`  ${u.role.padEnd(11)} ${u.email.padEnd(32)} ${u.password}`);
	})
	.catch((error: unknown) => {
		console.error(error instanceof Error ? error.message : error);
		process.exitCode = 1;
	})
	.finally(() => closeDb());
