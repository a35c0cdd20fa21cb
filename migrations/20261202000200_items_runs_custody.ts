import type { Knex } from 'knex';

/**
 * Originals (items), restoration runs, the append-only custody ledger and API tokens.
 * The ledger refuses UPDATE and DELETE through triggers: corrections are new events.
 */
export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('items', (t) => {
		t.increments('id').primary();
		t.integer('case_id').unsigned().notNullable().references('cases.id').onDelete('RESTRICT');
		t.string('original_name', 255).notNullable();
		t.specificType('sha256', 'CHAR(64)').notNullable();
		t.specificType('md5', 'CHAR(32)').notNullable();
		t.bigInteger('size_bytes').unsigned().notNullable();
		t.enu('format', ['jpeg', 'png', 'tiff']).notNullable();
		t.integer('width').unsigned().notNullable();
		t.integer('height').unsigned().notNullable();
		t.tinyint('bit_depth').unsigned().notNullable();
		t.tinyint('channels').unsigned().notNullable();
		t.boolean('has_icc').notNullable();
		t.json('exif').nullable();
		t.json('analysis').nullable(); // clipped share, noise estimate: computed once at intake
		t.string('storage_key', 255).notNullable();
		t.string('preview_key', 255).nullable();
		t.integer('uploaded_by').unsigned().notNullable().references('users.id').onDelete('RESTRICT');
		t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
		t.unique(['case_id', 'sha256']);
	});

	await knex.schema.createTable('runs', (t) => {
		t.increments('id').primary();
		t.integer('item_id').unsigned().notNullable().references('items.id').onDelete('RESTRICT');
		t.integer('requested_by').unsigned().notNullable().references('users.id').onDelete('RESTRICT');
		t.integer('replay_of').unsigned().nullable().references('runs.id').onDelete('RESTRICT');
		t.string('method', 16).notNullable();
		t.json('psf').notNullable();
		t.json('params').notNullable();
		t.string('engine_version', 64).notNullable();
		t.enu('status', ['queued', 'running', 'succeeded', 'failed', 'cancelled']).notNullable().defaultTo('queued');
		t.double('progress').notNullable().defaultTo(0);
		t.text('error').nullable();
		t.specificType('result_sha256', 'CHAR(64)').nullable();
		t.string('result_key', 255).nullable();
		t.string('preview_key', 255).nullable();
		t.json('record').nullable(); // the engine's full run record
		t.boolean('replay_matches').nullable(); // on a replay: did its result hash equal the original run's?
		t.tinyint('attempts').unsigned().notNullable().defaultTo(0);
		t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
		t.datetime('started_at', { precision: 3 }).nullable();
		t.datetime('finished_at', { precision: 3 }).nullable();
		t.index(['item_id', 'created_at']);
		t.index(['status']);
	});

	await knex.schema.createTable('custody_events', (t) => {
		// Ids are assigned by the ledger service under a lock, so each hash can cover its own id.
		t.integer('id').unsigned().primary();
		t.integer('case_id').unsigned().nullable().references('cases.id').onDelete('RESTRICT');
		t.integer('item_id').unsigned().nullable().references('items.id').onDelete('RESTRICT');
		t.integer('run_id').unsigned().nullable().references('runs.id').onDelete('RESTRICT');
		t.integer('actor_id').unsigned().nullable().references('users.id').onDelete('RESTRICT');
		t.string('actor_role', 16).notNullable(); // a user's role, or 'system' for the worker
		t.string('action', 48).notNullable();
		t.string('premis_event_type', 48).nullable();
		t.datetime('occurred_at', { precision: 3 }).notNullable();
		t.json('detail').notNullable();
		t.specificType('hash_before', 'CHAR(64)').nullable();
		t.specificType('hash_after', 'CHAR(64)').nullable();
		t.specificType('prev_hash', 'CHAR(64)').notNullable();
		t.specificType('event_hash', 'CHAR(64)').notNullable().unique();
		t.index(['item_id', 'id']);
		t.index(['case_id', 'id']);
	});

	// The head names the last event: appends lock this one row, so the chain never forks, and a
	// deleted tail shows up as a head that points past the last event.
	await knex.schema.createTable('custody_ledger_head', (t) => {
		t.tinyint('id').unsigned().primary();
		t.integer('last_event_id').unsigned().notNullable();
		t.specificType('last_event_hash', 'CHAR(64)').notNullable();
	});
	await knex('custody_ledger_head').insert({ id: 1, last_event_id: 0, last_event_hash: '0'.repeat(64) });

	for (const op of ['UPDATE', 'DELETE']) {
		await knex.raw(`
			CREATE TRIGGER custody_events_no_${op.toLowerCase()} BEFORE ${op} ON custody_events
			FOR EACH ROW SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'custody_events is append-only: ${op} refused'`);
	}

	await knex.schema.createTable('api_tokens', (t) => {
		t.increments('id').primary();
		t.integer('user_id').unsigned().notNullable().references('users.id').onDelete('CASCADE');
		t.string('name', 80).notNullable();
		t.specificType('token_hash', 'CHAR(64)').notNullable().unique(); // SHA-256 of the secret
		t.string('token_prefix', 16).notNullable(); // shown to the owner to tell tokens apart
		t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
		t.datetime('last_used_at', { precision: 3 }).nullable();
		t.datetime('revoked_at', { precision: 3 }).nullable();
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTableIfExists('api_tokens');
	await knex.raw('DROP TRIGGER IF EXISTS custody_events_no_update');
	await knex.raw('DROP TRIGGER IF EXISTS custody_events_no_delete');
	await knex.schema.dropTableIfExists('custody_ledger_head');
	await knex.schema.dropTableIfExists('custody_events');
	await knex.schema.dropTableIfExists('runs');
	await knex.schema.dropTableIfExists('items');
}
