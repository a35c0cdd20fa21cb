/** `tsx scripts/migrate.ts latest|rollback-all|status` against the configured database. */
import { closeDb, db } from '../src/lib/server/db';

const command = process.argv[2] ?? 'latest';

async function main(): Promise<void> {
	const knex = db();
	if (command === 'latest') {
		const [batch, names] = await knex.migrate.latest();
		console.log(names.length ? `migrated (batch ${batch}): ${names.join(', ')}` : 'database is up to date');
	} else if (command === 'rollback-all') {
		const [, names] = await knex.migrate.rollback(undefined, true);
		console.log(names.length ? `rolled back: ${names.join(', ')}` : 'nothing to roll back');
	} else if (command === 'status') {
		const [done, pending] = await knex.migrate.list();
		console.log(`applied ${done.length}, pending ${pending.length}`);
	} else {
		throw new Error(`unknown command "${command}" (use latest, rollback-all or status)`);
	}
}

main()
	.catch((error: unknown) => {
		console.error(error instanceof Error ? error.message : error);
		process.exitCode = 1;
	})
	.finally(() => closeDb());
