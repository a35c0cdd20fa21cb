/** All SQL touching the custody ledger. Appends go through `appendLocked` only. */
import type { Knex } from 'knex';

export interface CustodyEventRow {
	id: number;
	caseId: number | null;
	itemId: number | null;
	runId: number | null;
	actorId: number | null;
	actorName: string | null;
	actorRole: string;
	action: string;
	premisEventType: string | null;
	occurredAt: Date;
	detail: Record<string, unknown>;
	hashBefore: string | null;
	hashAfter: string | null;
	prevHash: string;
	eventHash: string;
}

export type NewCustodyEventRow = Omit<CustodyEventRow, 'actorName'>;

const columns = [
	'e.id',
	'e.case_id as caseId',
	'e.item_id as itemId',
	'e.run_id as runId',
	'e.actor_id as actorId',
	'u.name as actorName',
	'e.actor_role as actorRole',
	'e.action',
	'e.premis_event_type as premisEventType',
	'e.occurred_at as occurredAt',
	'e.detail',
	'e.hash_before as hashBefore',
	'e.hash_after as hashAfter',
	'e.prev_hash as prevHash',
	'e.event_hash as eventHash'
];

function fromDb(row: Record<string, unknown>): CustodyEventRow {
	const detail = typeof row.detail === 'string' ? JSON.parse(row.detail) : row.detail;
	return { ...(row as unknown as CustodyEventRow), detail };
}

export function custodyRepository(knex: Knex) {
	const select = (trx: Knex) => trx('custody_events as e').leftJoin('users as u', 'u.id', 'e.actor_id').select(columns);

	return {
		/** Lock the ledger head for the rest of `trx`: concurrent appends wait their turn. */
		async lockHead(trx: Knex.Transaction): Promise<{ lastEventId: number; lastEventHash: string }> {
			const head = await trx('custody_ledger_head')
				.select('last_event_id as lastEventId', 'last_event_hash as lastEventHash')
				.where({ id: 1 })
				.forUpdate()
				.first();
			if (!head) throw new Error('custody ledger head row is missing (migrations not applied?)');
			return head;
		},

		async insertAndAdvance(event: NewCustodyEventRow, trx: Knex.Transaction): Promise<void> {
			await trx('custody_events').insert({
				id: event.id,
				case_id: event.caseId,
				item_id: event.itemId,
				run_id: event.runId,
				actor_id: event.actorId,
				actor_role: event.actorRole,
				action: event.action,
				premis_event_type: event.premisEventType,
				occurred_at: event.occurredAt,
				detail: JSON.stringify(event.detail),
				hash_before: event.hashBefore,
				hash_after: event.hashAfter,
				prev_hash: event.prevHash,
				event_hash: event.eventHash
			});
			await trx('custody_ledger_head').where({ id: 1 }).update({ last_event_id: event.id, last_event_hash: event.eventHash });
		},

		async head(trx: Knex = knex): Promise<{ lastEventId: number; lastEventHash: string }> {
			return trx('custody_ledger_head')
				.select('last_event_id as lastEventId', 'last_event_hash as lastEventHash')
				.where({ id: 1 })
				.first();
		},

		/** Events with id > afterId in id order, a batch at a time (for verification). */
		async batchAfter(afterId: number, limit: number, trx: Knex = knex): Promise<CustodyEventRow[]> {
			const rows = await select(trx).where('e.id', '>', afterId).orderBy('e.id').limit(limit);
			return rows.map(fromDb);
		},

		async forItem(itemId: number, trx: Knex = knex): Promise<CustodyEventRow[]> {
			const rows = await select(trx).where('e.item_id', itemId).orderBy('e.id');
			return rows.map(fromDb);
		},

		async forCase(caseId: number, trx: Knex = knex): Promise<CustodyEventRow[]> {
			const rows = await select(trx).where('e.case_id', caseId).orderBy('e.id');
			return rows.map(fromDb);
		}
	};
}
