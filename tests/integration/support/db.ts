/** Database handles for the integration tests, built from the app's own Knex settings. */
import knexFactory, { type Knex } from 'knex';
import { knexConfig } from '../../../src/lib/server/db';
import { databaseName } from './context';

/** Only names the app's config would accept, so interpolating one as an identifier is safe. */
export function assertDatabaseName(name: string): string {
	if (!/^[a-z0-9_]+$/.test(name)) throw new Error(`Refusing database name "${name}": use a-z, 0-9 and _`);
	return name;
}

/** A connection to the server with no database selected, for CREATE/DROP DATABASE. */
export function serverKnex(): Knex {
	const base = knexConfig();
	return knexFactory({ ...base, connection: { ...(base.connection as object), database: undefined }, pool: { min: 0, max: 1 } });
}

export function knexFor(database: string): Knex {
	return knexFactory(knexConfig({ database: assertDatabaseName(database) }));
}

export async function recreateDatabase(server: Knex, name: string): Promise<void> {
	await server.raw('DROP DATABASE IF EXISTS ??', [assertDatabaseName(name)]);
	await server.raw('CREATE DATABASE ?? CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci', [name]);
}

let suiteDb: Knex | undefined;

/** The suite database the test server uses; one pool per test file, closed by `closeTestDb`. */
export function testDb(): Knex {
	suiteDb ??= knexFor(databaseName());
	return suiteDb;
}

export async function closeTestDb(): Promise<void> {
	const closing = suiteDb;
	suiteDb = undefined;
	await closing?.destroy();
}

export async function countRows(table: string): Promise<number> {
	const row = await testDb()(table).count({ n: '*' }).first();
	return Number(row?.n ?? 0);
}

export async function idOf(table: 'users' | 'cases', where: Record<string, string>): Promise<number> {
	const row = await testDb()(table).select('id').where(where).first();
	if (!row) throw new Error(`No ${table} row matches ${JSON.stringify(where)}: was the demo seeded?`);
	return Number(row.id);
}
