/** All SQL touching `reports`. Reports are inserted once; the table refuses UPDATE and DELETE. */
import type { Knex } from 'knex';

export interface ReportRow {
	id: number;
	reportId: string;
	proposalId: number;
	itemId: number;
	caseId: number;
	pdfSha256: string;
	storageKey: string;
	releasedBy: number;
	releasedByName: string;
	releasedAt: Date;
}

export type NewReportRow = Omit<ReportRow, 'id' | 'releasedByName'>;

const columns = [
	'rp.id',
	'rp.report_id as reportId',
	'rp.proposal_id as proposalId',
	'rp.item_id as itemId',
	'rp.case_id as caseId',
	'rp.pdf_sha256 as pdfSha256',
	'rp.storage_key as storageKey',
	'rp.released_by as releasedBy',
	'u.name as releasedByName',
	'rp.released_at as releasedAt'
];

export function reportRepository(knex: Knex) {
	const select = (trx: Knex) => trx('reports as rp').join('users as u', 'u.id', 'rp.released_by').select(columns);

	return {
		findByReportId: (reportId: string, trx: Knex = knex): Promise<ReportRow | undefined> => select(trx).where('rp.report_id', reportId).first(),
		findByProposal: (proposalId: number, trx: Knex = knex): Promise<ReportRow | undefined> => select(trx).where('rp.proposal_id', proposalId).first(),
		findByPdfSha256: (sha256: string, trx: Knex = knex): Promise<ReportRow | undefined> => select(trx).where('rp.pdf_sha256', sha256).first(),
		/** The item's latest report: a re-release after new work supersedes the earlier one. */
		latestForItem: (itemId: number, trx: Knex = knex): Promise<ReportRow | undefined> => select(trx).where('rp.item_id', itemId).orderBy('rp.id', 'desc').first(),

		async releasedItemIds(caseId: number, trx: Knex = knex): Promise<Set<number>> {
			return new Set((await trx('reports').distinct('item_id').where('case_id', caseId)).map((r) => Number(r.item_id)));
		},

		/** Released items in cases the user is a member of, newest release first. */
		async releasedToMember(userId: number, trx: Knex = knex) {
			return select(trx)
				.join('items as i', 'i.id', 'rp.item_id')
				.join('cases as c', 'c.id', 'rp.case_id')
				.join('case_members as m', function () {
					this.on('m.case_id', '=', 'rp.case_id').andOn('m.user_id', '=', trx.raw('?', [userId]));
				})
				.select('i.original_name as itemName', 'c.reference as caseReference', 'c.title as caseTitle')
				.orderBy('rp.id', 'desc') as Promise<(ReportRow & { itemName: string; caseReference: string; caseTitle: string })[]>;
		},

		async insert(row: NewReportRow, trx: Knex): Promise<number> {
			const [id] = await trx('reports').insert({
				report_id: row.reportId,
				proposal_id: row.proposalId,
				item_id: row.itemId,
				case_id: row.caseId,
				pdf_sha256: row.pdfSha256,
				storage_key: row.storageKey,
				released_by: row.releasedBy,
				released_at: row.releasedAt
			});
			return id;
		}
	};
}
