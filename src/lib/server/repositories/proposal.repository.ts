/**
 * All SQL touching `proposals`. A proposal changes only by a decision taken while it awaits
 * review (or, once approved, by its release); every such UPDATE names the status it expects, so
 * two reviewers racing on one proposal cannot both decide it.
 */
import type { Knex } from 'knex';

export const PROPOSAL_STATUSES = ['awaiting_review', 'returned', 'approved', 'released', 'superseded'] as const;
export type ProposalStatus = (typeof PROPOSAL_STATUSES)[number];

export interface ProposalRow {
	id: number;
	itemId: number;
	caseId: number;
	caseReference: string;
	itemName: string;
	runId: number;
	runAuthorId: number;
	submittedBy: number;
	submittedByName: string;
	statement: string;
	status: ProposalStatus;
	decidedBy: number | null;
	decidedByName: string | null;
	decidedAt: Date | null;
	decisionComment: string | null;
	createdAt: Date;
}

const columns = [
	'p.id',
	'p.item_id as itemId',
	'i.case_id as caseId',
	'c.reference as caseReference',
	'i.original_name as itemName',
	'p.run_id as runId',
	'r.requested_by as runAuthorId',
	'p.submitted_by as submittedBy',
	's.name as submittedByName',
	'p.statement',
	'p.status',
	'p.decided_by as decidedBy',
	'd.name as decidedByName',
	'p.decided_at as decidedAt',
	'p.decision_comment as decisionComment',
	'p.created_at as createdAt'
];

export function proposalRepository(knex: Knex) {
	const select = (trx: Knex) =>
		trx('proposals as p')
			.join('items as i', 'i.id', 'p.item_id')
			.join('cases as c', 'c.id', 'i.case_id')
			.join('runs as r', 'r.id', 'p.run_id')
			.join('users as s', 's.id', 'p.submitted_by')
			.leftJoin('users as d', 'd.id', 'p.decided_by')
			.select(columns);

	return {
		async findById(id: number, trx: Knex = knex): Promise<ProposalRow | undefined> {
			return select(trx).where('p.id', id).first();
		},

		/** The item's proposals, newest first: the first is its current state. */
		async listForItem(itemId: number, trx: Knex = knex): Promise<ProposalRow[]> {
			return select(trx).where('p.item_id', itemId).orderBy('p.id', 'desc');
		},

		async listByStatus(statuses: ProposalStatus[], trx: Knex = knex): Promise<ProposalRow[]> {
			return select(trx).whereIn('p.status', statuses).orderBy('p.created_at', 'asc');
		},

		/** Lock the item's open proposals for the rest of `trx`, so two submissions serialise. */
		async lockOpenForItem(itemId: number, trx: Knex.Transaction): Promise<{ id: number; status: ProposalStatus }[]> {
			return trx('proposals').select('id', 'status').where('item_id', itemId).whereIn('status', ['awaiting_review', 'returned', 'approved', 'released']).forUpdate();
		},

		async insert(row: { itemId: number; runId: number; submittedBy: number; statement: string }, trx: Knex): Promise<number> {
			const [id] = await trx('proposals').insert({ item_id: row.itemId, run_id: row.runId, submitted_by: row.submittedBy, statement: row.statement });
			return id;
		},

		/** Move a proposal on from the status the caller saw; false when someone else moved it first. */
		async transition(id: number, from: ProposalStatus, to: ProposalStatus, trx: Knex, decision?: { by: number; at: Date; comment: string }): Promise<boolean> {
			const changes: Record<string, unknown> = { status: to };
			if (decision) Object.assign(changes, { decided_by: decision.by, decided_at: decision.at, decision_comment: decision.comment });
			return (await trx('proposals').where({ id, status: from }).update(changes)) === 1;
		}
	};
}
