/**
 * The custody ledger: an append-only, hash-chained record of everything done to a case, an
 * original or a run. Each event's hash covers its own id, its content and the previous event's
 * hash, so an edited, deleted or reordered event breaks every hash after it (Schneier & Kelsey,
 * "Secure audit logs to support computer forensics", ACM TISSEC 2(2), 1999; NIST SP 800-53 rev. 5
 * AU-9(3)). The database refuses UPDATE and DELETE on the table (triggers in the migration).
 */
import { createHash } from 'node:crypto';
import type { Knex } from 'knex';
import type { Clock } from '../clock';
import { canonicalJson, type Json } from '../canonical-json';
import { CUSTODY_ACTIONS, GENESIS_HASH, type CustodyAction } from '../custody-actions';
import { custodyRepository, type CustodyEventRow, type NewCustodyEventRow } from '../repositories/custody.repository';

export interface CustodyActor {
	id: number | null;
	/** The user's role, or 'system' for the worker acting on its own. */
	role: string;
}

export interface CustodyEventInput {
	action: CustodyAction;
	actor: CustodyActor;
	caseId?: number | null;
	itemId?: number | null;
	runId?: number | null;
	detail?: Record<string, Json>;
	hashBefore?: string | null;
	hashAfter?: string | null;
}

export interface LedgerVerification {
	intact: boolean;
	checked: number;
	firstBrokenEventId: number | null;
	reason: string | null;
}

/** SHA-256 over the canonical serialisation of everything the event states, its id included. */
export function eventHash(event: Omit<NewCustodyEventRow, 'eventHash'>): string {
	const body: Json = {
		id: event.id,
		prevHash: event.prevHash,
		caseId: event.caseId,
		itemId: event.itemId,
		runId: event.runId,
		actorId: event.actorId,
		actorRole: event.actorRole,
		action: event.action,
		premisEventType: event.premisEventType,
		occurredAt: event.occurredAt.toISOString(),
		detail: event.detail as Json,
		hashBefore: event.hashBefore,
		hashAfter: event.hashAfter
	};
	return createHash('sha256').update(canonicalJson(body), 'utf8').digest('hex');
}

export function custodyService(knex: Knex, clock: Clock) {
	const ledger = custodyRepository(knex);

	async function appendWithin(trx: Knex.Transaction, input: CustodyEventInput): Promise<NewCustodyEventRow> {
		const head = await ledger.lockHead(trx);
		// DATETIME(3) keeps milliseconds; truncate here so the hashed time is the stored time.
		const occurredAt = new Date(Math.floor(clock.now().getTime()));
		const partial = {
			id: head.lastEventId + 1,
			caseId: input.caseId ?? null,
			itemId: input.itemId ?? null,
			runId: input.runId ?? null,
			actorId: input.actor.id,
			actorRole: input.actor.role,
			action: input.action,
			premisEventType: CUSTODY_ACTIONS[input.action],
			occurredAt,
			detail: input.detail ?? {},
			hashBefore: input.hashBefore ?? null,
			hashAfter: input.hashAfter ?? null,
			prevHash: head.lastEventHash
		};
		const event = { ...partial, eventHash: eventHash(partial) };
		await ledger.insertAndAdvance(event, trx);
		return event;
	}

	return {
		/** Append one event; inside the caller's transaction when given, so it commits with their change. */
		record(input: CustodyEventInput, trx?: Knex.Transaction): Promise<NewCustodyEventRow> {
			return trx ? appendWithin(trx, input) : knex.transaction((own) => appendWithin(own, input));
		},

		forItem: (itemId: number) => ledger.forItem(itemId),
		forCase: (caseId: number) => ledger.forCase(caseId),

		/**
		 * Recompute the whole chain from the first event: ids must run 1, 2, 3…, each prev_hash must
		 * equal the previous event_hash, each event_hash must match its content, and the head must
		 * name the last event (a deleted tail leaves the head pointing past it).
		 */
		async verify(batchSize = 1000): Promise<LedgerVerification> {
			let expectedId = 1;
			let prevHash = GENESIS_HASH;
			let checked = 0;
			const broken = (id: number, reason: string): LedgerVerification => ({
				intact: false,
				checked,
				firstBrokenEventId: id,
				reason
			});
			for (;;) {
				const batch: CustodyEventRow[] = await ledger.batchAfter(expectedId - 1, batchSize);
				for (const row of batch) {
					if (row.id !== expectedId) return broken(expectedId, `event ${expectedId} is missing`);
					if (row.prevHash !== prevHash) return broken(row.id, 'does not link to the previous event');
					const { actorName: _unused, ...stored } = row;
					if (eventHash(stored) !== row.eventHash) return broken(row.id, 'content does not match its hash');
					prevHash = row.eventHash;
					expectedId++;
					checked++;
				}
				if (batch.length < batchSize) break;
			}
			const head = await ledger.head();
			if (head.lastEventId !== checked || head.lastEventHash !== prevHash) {
				return broken(checked + 1, `the ledger head names event ${head.lastEventId}, the chain ends at ${checked}`);
			}
			return { intact: true, checked, firstBrokenEventId: null, reason: null };
		}
	};
}
