import type { Knex } from 'knex';

/** Users with one role each; cases; who may see a case (membership). */
export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('users', (t) => {
		t.increments('id').primary();
		t.string('name', 120).notNullable();
		t.string('email', 254).notNullable().unique();
		t.enu('role', ['admin', 'technician', 'supervisor', 'client']).notNullable();
		t.string('password_hash', 100).notNullable();
		t.boolean('active').notNullable().defaultTo(true);
		t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
		t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
	});

	await knex.schema.createTable('cases', (t) => {
		t.increments('id').primary();
		t.string('title', 200).notNullable();
		t.string('reference', 40).notNullable().unique();
		t.enu('kind', ['forensic', 'archival']).notNullable();
		t.enu('status', ['open', 'in_review', 'released', 'closed']).notNullable().defaultTo('open');
		t.text('description').nullable();
		t.integer('created_by').unsigned().notNullable().references('users.id').onDelete('RESTRICT');
		t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
		t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
		t.index(['status']);
	});

	await knex.schema.createTable('case_members', (t) => {
		t.integer('case_id').unsigned().notNullable().references('cases.id').onDelete('CASCADE');
		t.integer('user_id').unsigned().notNullable().references('users.id').onDelete('CASCADE');
		t.integer('added_by').unsigned().notNullable().references('users.id').onDelete('RESTRICT');
		t.datetime('added_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
		t.primary(['case_id', 'user_id']);
		t.index(['user_id']);
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTableIfExists('case_members');
	await knex.schema.dropTableIfExists('cases');
	await knex.schema.dropTableIfExists('users');
}
