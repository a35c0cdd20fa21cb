/** The process's single Knex instance (web, worker and scripts each create one here). */
import knexFactory, { type Knex } from 'knex';
import { config } from './config';

export function knexConfig(overrides: Partial<{ database: string }> = {}): Knex.Config {
	const c = config();
	return {
		client: 'mysql2',
		connection: {
			host: c.DATABASE_HOST,
			port: c.DATABASE_PORT,
			user: c.DATABASE_USER,
			password: c.DATABASE_PASSWORD,
			database: overrides.database ?? c.DATABASE_NAME,
			// Store and read DATETIME as UTC whatever the host's zone.
			timezone: 'Z',
			dateStrings: false,
			supportBigNumbers: true,
			bigNumberStrings: false
		},
		pool: { min: 0, max: 10 },
		migrations: { directory: 'migrations', loadExtensions: ['.ts'], tableName: 'knex_migrations' }
	};
}

let instance: Knex | undefined;

export function db(): Knex {
	instance ??= knexFactory(knexConfig());
	return instance;
}

export async function closeDb(): Promise<void> {
	if (instance) {
		const closing = instance;
		instance = undefined;
		await closing.destroy();
	}
}
