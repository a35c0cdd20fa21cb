import type { Knex } from 'knex';

/**
 * Review and release (issue 6). A proposal puts one succeeded run forward as an item's result;
 * a second qualified person approves or returns it, and an approved proposal may be released
 * as a report. Technical records keep original and amended data (ISO/IEC 17025:2017 §7.5), so a
 * decided proposal is never edited: new work is a new proposal, and triggers refuse changes to
 * an approved proposal's substance or decision. Reports are append-only.
 */
export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('proposals', (t) => {
		t.increments('id').primary();
		t.integer('item_id').unsigned().notNullable().references('items.id').onDelete('RESTRICT');
		t.integer('run_id').unsigned().notNullable().references('runs.id').onDelete('RESTRICT');
		t.integer('submitted_by').unsigned().notNullable().references('users.id').onDelete('RESTRICT');
		t.text('statement').notNullable();
		t.enu('status', ['awaiting_review', 'returned', 'approved', 'released', 'superseded']).notNullable().defaultTo('awaiting_review');
		t.integer('decided_by').unsigned().nullable().references('users.id').onDelete('RESTRICT');
		t.datetime('decided_at', { precision: 3 }).nullable();
		t.text('decision_comment').nullable();
		t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
		t.index(['item_id', 'id']);
		t.index(['status']);
	});

	// Once approved, only the step to 'released' is allowed; the run, statement and decision stay.
	await knex.raw(`
		CREATE TRIGGER proposals_frozen_when_approved BEFORE UPDATE ON proposals
		FOR EACH ROW BEGIN
			IF OLD.status IN ('approved', 'released') AND (
				NOT (NEW.status = OLD.status OR (OLD.status = 'approved' AND NEW.status = 'released'))
				OR NEW.run_id <> OLD.run_id OR NEW.item_id <> OLD.item_id OR NEW.submitted_by <> OLD.submitted_by
				OR NEW.statement <> OLD.statement OR NOT (NEW.decided_by <=> OLD.decided_by)
				OR NOT (NEW.decided_at <=> OLD.decided_at) OR NOT (NEW.decision_comment <=> OLD.decision_comment)
			) THEN
				SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'an approved proposal is frozen: UPDATE refused';
			END IF;
		END`);
	await knex.raw(`
		CREATE TRIGGER proposals_no_delete BEFORE DELETE ON proposals
		FOR EACH ROW SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'proposals are kept: DELETE refused'`);

	await knex.schema.createTable('reports', (t) => {
		t.increments('id').primary();
		// The id printed on the report and typed into the verify page: unguessable, not a counter.
		t.string('report_id', 32).notNullable().unique();
		t.integer('proposal_id').unsigned().notNullable().unique().references('proposals.id').onDelete('RESTRICT');
		t.integer('item_id').unsigned().notNullable().references('items.id').onDelete('RESTRICT');
		t.integer('case_id').unsigned().notNullable().references('cases.id').onDelete('RESTRICT');
		t.specificType('pdf_sha256', 'CHAR(64)').notNullable().unique();
		t.string('storage_key', 255).notNullable();
		t.integer('released_by').unsigned().notNullable().references('users.id').onDelete('RESTRICT');
		t.datetime('released_at', { precision: 3 }).notNullable();
		t.index(['item_id']);
		t.index(['case_id']);
	});
	for (const op of ['UPDATE', 'DELETE']) {
		await knex.raw(`
			CREATE TRIGGER reports_no_${op.toLowerCase()} BEFORE ${op} ON reports
			FOR EACH ROW SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'reports are append-only: ${op} refused'`);
	}
}

export async function down(knex: Knex): Promise<void> {
	await knex.raw('DROP TRIGGER IF EXISTS reports_no_update');
	await knex.raw('DROP TRIGGER IF EXISTS reports_no_delete');
	await knex.schema.dropTableIfExists('reports');
	await knex.raw('DROP TRIGGER IF EXISTS proposals_frozen_when_approved');
	await knex.raw('DROP TRIGGER IF EXISTS proposals_no_delete');
	await knex.schema.dropTableIfExists('proposals');
}
