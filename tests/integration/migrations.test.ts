/**
 * Migrations up and down on the real MariaDB (issue 2 §3: "Migrations run up and down cleanly"),
 * on a scratch database of their own so the running test server is not disturbed.
 */
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { databaseName } from './support/context';
import { knexFor, recreateDatabase, serverKnex } from './support/db';
import { migrationSource } from './support/migrations';

const KNEX_TABLES = ['knex_migrations', 'knex_migrations_lock'];

let server: Knex;
let knex: Knex;
let scratch: string;

async function tables(): Promise<string[]> {
	const rows = await knex('information_schema.TABLES').where({ TABLE_SCHEMA: scratch }).select('TABLE_NAME as name');
	return rows.map((r) => r.name).sort();
}

async function columns(table: string): Promise<Record<string, { type: string; nullable: boolean }>> {
	const rows = await knex('information_schema.COLUMNS')
		.where({ TABLE_SCHEMA: scratch, TABLE_NAME: table })
		.select('COLUMN_NAME as name', 'COLUMN_TYPE as type', 'IS_NULLABLE as nullable');
	return Object.fromEntries(rows.map((r) => [r.name, { type: r.type, nullable: r.nullable === 'YES' }]));
}

/** Index name → its columns in order, for unique indexes (the primary key included). */
async function uniqueIndexes(table: string): Promise<string[][]> {
	const rows = await knex('information_schema.STATISTICS')
		.where({ TABLE_SCHEMA: scratch, TABLE_NAME: table, NON_UNIQUE: 0 })
		.orderBy(['INDEX_NAME', 'SEQ_IN_INDEX'])
		.select('INDEX_NAME as index', 'COLUMN_NAME as column');
	const byIndex = new Map<string, string[]>();
	for (const r of rows) byIndex.set(r.index, [...(byIndex.get(r.index) ?? []), r.column]);
	return [...byIndex.values()];
}

async function foreignKeys(table: string): Promise<string[]> {
	const rows = await knex('information_schema.KEY_COLUMN_USAGE')
		.where({ TABLE_SCHEMA: scratch, TABLE_NAME: table })
		.whereNotNull('REFERENCED_TABLE_NAME')
		.select('COLUMN_NAME as column', 'REFERENCED_TABLE_NAME as refTable', 'REFERENCED_COLUMN_NAME as refColumn');
	return rows.map((r) => `${r.column} → ${r.refTable}.${r.refColumn}`).sort();
}

/** Everything a migration defines, to compare a schema before and after a down/up cycle. */
async function schemaSnapshot() {
	const cols = await knex('information_schema.COLUMNS')
		.where({ TABLE_SCHEMA: scratch })
		.orderBy(['TABLE_NAME', 'ORDINAL_POSITION'])
		.select('TABLE_NAME', 'COLUMN_NAME', 'COLUMN_TYPE', 'IS_NULLABLE', 'COLUMN_DEFAULT', 'COLUMN_KEY');
	const indexes = await knex('information_schema.STATISTICS')
		.where({ TABLE_SCHEMA: scratch })
		.orderBy(['TABLE_NAME', 'INDEX_NAME', 'SEQ_IN_INDEX'])
		.select('TABLE_NAME', 'INDEX_NAME', 'NON_UNIQUE', 'COLUMN_NAME');
	return { cols, indexes };
}

async function expectDuplicateRefused(insert: Promise<unknown>): Promise<void> {
	await expect(insert).rejects.toMatchObject({ code: 'ER_DUP_ENTRY' });
}

beforeAll(async () => {
	scratch = `${databaseName()}_migrations`;
	server = serverKnex();
	await recreateDatabase(server, scratch);
	knex = knexFor(scratch);
});

afterAll(async () => {
	await knex?.destroy();
	await server?.raw('DROP DATABASE IF EXISTS ??', [scratch]);
	await server?.destroy();
});

describe('migrations on a scratch database', () => {
	let firstSchema: Awaited<ReturnType<typeof schemaSnapshot>>;

	test('latest applies every migration file and leaves nothing pending', async () => {
		await knex.migrate.latest({ migrationSource });
		const [done, pending] = await knex.migrate.list({ migrationSource });
		expect(pending).toEqual([]);
		expect(done.length).toBe((await migrationSource.getMigrations([])).length);
		expect(await tables()).toEqual(expect.arrayContaining(['users', 'cases', 'case_members', ...KNEX_TABLES]));
		firstSchema = await schemaSnapshot();
	});

	test('users: name, e-mail, role (the four roles), password hash; e-mail unique', async () => {
		const c = await columns('users');
		for (const name of ['id', 'name', 'email', 'role', 'password_hash']) {
			expect(c[name], name).toBeDefined();
			expect(c[name].nullable, `${name} is NOT NULL`).toBe(false);
		}
		expect(c.role.type).toBe("enum('admin','technician','supervisor','client')");
		expect(await uniqueIndexes('users')).toEqual(expect.arrayContaining([['id'], ['email']]));
	});

	test('cases: title, reference (unique), kind forensic|archival, status, created by → users', async () => {
		const c = await columns('cases');
		for (const name of ['id', 'title', 'reference', 'kind', 'status', 'created_by']) {
			expect(c[name], name).toBeDefined();
			expect(c[name].nullable, `${name} is NOT NULL`).toBe(false);
		}
		expect(c.kind.type).toBe("enum('forensic','archival')");
		expect(c.status.type).toMatch(/^enum\('open'/);
		expect(await uniqueIndexes('cases')).toEqual(expect.arrayContaining([['id'], ['reference']]));
		expect(await foreignKeys('cases')).toContain('created_by → users.id');
	});

	test('case_members: primary key (case_id, user_id), both referencing their tables', async () => {
		expect(await uniqueIndexes('case_members')).toContainEqual(['case_id', 'user_id']);
		expect(await foreignKeys('case_members')).toEqual(expect.arrayContaining(['case_id → cases.id', 'user_id → users.id']));
	});

	test('the constraints hold on real rows: duplicate e-mail, reference and membership are refused', async () => {
		const user = { name: 'A', email: 'dup@stillpoint.test', role: 'client', password_hash: 'x' };
		const [userId] = await knex('users').insert(user);
		await expectDuplicateRefused(knex('users').insert({ ...user, name: 'B' }));

		const kase = { title: 'T', reference: 'DUP-1', kind: 'forensic', created_by: userId };
		const [caseId] = await knex('cases').insert(kase);
		await expectDuplicateRefused(knex('cases').insert({ ...kase, title: 'U' }));

		await knex('case_members').insert({ case_id: caseId, user_id: userId, added_by: userId });
		await expectDuplicateRefused(knex('case_members').insert({ case_id: caseId, user_id: userId, added_by: userId }));

		// A case cannot point at a user who does not exist.
		await expect(knex('cases').insert({ ...kase, reference: 'DUP-2', created_by: 999999 })).rejects.toMatchObject({
			code: 'ER_NO_REFERENCED_ROW_2'
		});
	});

	test('rolling everything back removes every table but Knex’s own bookkeeping', async () => {
		await knex.migrate.rollback({ migrationSource }, true);
		expect(await tables()).toEqual(KNEX_TABLES);
		expect(await knex('knex_migrations').count({ n: '*' })).toEqual([{ n: 0 }]);
	});

	test('latest again rebuilds exactly the same schema', async () => {
		await knex.migrate.latest({ migrationSource });
		expect(await schemaSnapshot()).toEqual(firstSchema);
	});
});
