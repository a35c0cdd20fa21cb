/**
 * The custody ledger on the real MariaDB: appends from many connections form one unbroken chain,
 * the triggers refuse UPDATE and DELETE, and tampering done by someone who bypasses the triggers
 * (dropping them, as an administrator with direct SQL access could) is reported at the first
 * broken event. Method: hash chaining after Schneier & Kelsey, ACM TISSEC 2(2), 1999.
 */
import knexFactory, { type Knex } from 'knex';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { knexConfig } from '../../src/lib/server/db';
import { systemClock } from '../../src/lib/server/clock';
import { custodyService, eventHash } from '../../src/lib/server/services/custody.service';
import { migrationSource } from './support/migrations';

const DATABASE = 'stillpoint_it_ledger';
let admin: Knex;
let knex: Knex;

async function freshLedger(): Promise<void> {
	await knex.migrate.rollback({ migrationSource }, true);
	await knex.migrate.latest({ migrationSource });
}

beforeAll(async () => {
	admin = knexFactory({ ...knexConfig(), connection: { ...(knexConfig().connection as object), database: undefined } });
	await admin.raw(`DROP DATABASE IF EXISTS \`${DATABASE}\``);
	await admin.raw(`CREATE DATABASE \`${DATABASE}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
	knex = knexFactory(knexConfig({ database: DATABASE }));
});

afterAll(async () => {
	await knex?.destroy();
	await admin?.raw(`DROP DATABASE IF EXISTS \`${DATABASE}\``);
	await admin?.destroy();
});

beforeEach(freshLedger);

const actor = { id: null, role: 'system' };

async function appendSome(n: number): Promise<void> {
	const ledger = custodyService(knex, systemClock);
	for (let i = 0; i < n; i++) await ledger.record({ action: 'fixity_checked', actor, detail: { n: i, outcome: 'success' } });
}

describe('custody ledger', () => {
	it('chains concurrent appends from separate connections without forks or gaps', async () => {
		const ledger = custodyService(knex, systemClock);
		await Promise.all(
			Array.from({ length: 40 }, (_, i) => ledger.record({ action: 'run_requested', actor, detail: { request: i } }))
		);
		const rows = await knex('custody_events').select('id', 'prev_hash', 'event_hash').orderBy('id');
		expect(rows.map((r) => r.id)).toEqual(Array.from({ length: 40 }, (_, i) => i + 1));
		for (let i = 1; i < rows.length; i++) expect(rows[i].prev_hash).toBe(rows[i - 1].event_hash);
		expect(await ledger.verify()).toEqual({ intact: true, checked: 40, firstBrokenEventId: null, reason: null });
	});

	it('stores a hash that anyone can recompute from the row (SHA-256, FIPS 180-4)', async () => {
		await appendSome(1);
		const [r] = await knex('custody_events').select('*');
		const row = {
			id: r.id,
			caseId: r.case_id,
			itemId: r.item_id,
			runId: r.run_id,
			actorId: r.actor_id,
			actorRole: r.actor_role,
			action: r.action,
			premisEventType: r.premis_event_type,
			occurredAt: r.occurred_at,
			detail: typeof r.detail === 'string' ? JSON.parse(r.detail) : r.detail,
			hashBefore: r.hash_before,
			hashAfter: r.hash_after,
			prevHash: r.prev_hash,
			eventHash: r.event_hash
		};
		expect(row.prevHash).toBe('0'.repeat(64));
		expect(row.premisEventType).toBe('fixity check');
		const { eventHash: stored, ...content } = row;
		expect(eventHash(content)).toBe(stored);
	});

	it('refuses UPDATE and DELETE through the triggers', async () => {
		await appendSome(2);
		await expect(knex('custody_events').where({ id: 1 }).update({ action: 'forged' })).rejects.toThrow(/append-only/);
		await expect(knex('custody_events').where({ id: 2 }).del()).rejects.toThrow(/append-only/);
		expect(await custodyService(knex, systemClock).verify()).toMatchObject({ intact: true, checked: 2 });
	});

	it('reports the first broken event when a row is edited behind the triggers', async () => {
		await appendSome(5);
		await knex.raw('DROP TRIGGER custody_events_no_update');
		await knex('custody_events').where({ id: 3 }).update({ detail: JSON.stringify({ n: 99, outcome: 'success' }) });
		expect(await custodyService(knex, systemClock).verify()).toMatchObject({
			intact: false,
			checked: 2,
			firstBrokenEventId: 3,
			reason: 'content does not match its hash'
		});
	});

	it('reports a removed event in the middle and a removed tail', async () => {
		await appendSome(5);
		await knex.raw('DROP TRIGGER custody_events_no_delete');
		await knex('custody_events').where({ id: 5 }).del();
		expect(await custodyService(knex, systemClock).verify()).toMatchObject({ intact: false, firstBrokenEventId: 5 });
		await knex('custody_events').where({ id: 2 }).del();
		expect(await custodyService(knex, systemClock).verify()).toMatchObject({
			intact: false,
			firstBrokenEventId: 2,
			reason: 'event 2 is missing'
		});
	});

	it('reports a truncated ledger (TRUNCATE fires no DELETE trigger) through the head', async () => {
		await appendSome(3);
		await knex.raw('TRUNCATE TABLE custody_events');
		expect(await custodyService(knex, systemClock).verify()).toMatchObject({ intact: false, checked: 0, firstBrokenEventId: 1 });
	});

	it('reports two events swapped in place (reordering)', async () => {
		await appendSome(4);
		await knex.raw('DROP TRIGGER custody_events_no_update');
		const [a, b] = await knex('custody_events').whereIn('id', [2, 3]).orderBy('id');
		await knex('custody_events').where({ id: 2 }).update({ detail: JSON.stringify(b.detail), occurred_at: b.occurred_at });
		await knex('custody_events').where({ id: 3 }).update({ detail: JSON.stringify(a.detail), occurred_at: a.occurred_at });
		expect(await custodyService(knex, systemClock).verify()).toMatchObject({ intact: false, firstBrokenEventId: 2 });
	});
});
