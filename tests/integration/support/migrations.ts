/**
 * The project's migrations as a Knex migration source loaded through vite, because Node 20
 * cannot import the `.ts` files itself when Knex reads the directory (the CLI runs under tsx).
 * Names are the file names, as Knex's own directory source records them, so a database
 * migrated here and one migrated by `scripts/migrate.ts` agree.
 */
import type { Knex } from 'knex';

const modules = import.meta.glob<Knex.Migration>('../../../migrations/*.ts');

export const migrationSource: Knex.MigrationSource<string> = {
	async getMigrations() {
		return Object.keys(modules).sort();
	},
	getMigrationName(path) {
		return path.slice(path.lastIndexOf('/') + 1);
	},
	getMigration(path) {
		return modules[path]();
	}
};
