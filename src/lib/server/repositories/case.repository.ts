/** All SQL touching `cases` and `case_members`. */
import type { Knex } from 'knex';
import type { CaseKind, CaseListQuery, CaseStatus } from '../../schemas/case';

export interface CaseRow {
	id: number;
	title: string;
	reference: string;
	kind: CaseKind;
	status: CaseStatus;
	description: string | null;
	createdBy: number;
	createdByName: string;
	createdAt: Date;
	updatedAt: Date;
}

export interface CaseMemberRow {
	userId: number;
	name: string;
	email: string;
	role: string;
	addedAt: Date;
}

const sortColumns: Record<CaseListQuery['sort'], string> = {
	reference: 'c.reference',
	title: 'c.title',
	kind: 'c.kind',
	status: 'c.status',
	createdAt: 'c.created_at'
};

function baseQuery(trx: Knex) {
	return trx('cases as c')
		.join('users as u', 'u.id', 'c.created_by')
		.select(
			'c.id',
			'c.title',
			'c.reference',
			'c.kind',
			'c.status',
			'c.description',
			'c.created_by as createdBy',
			'u.name as createdByName',
			'c.created_at as createdAt',
			'c.updated_at as updatedAt'
		);
}

/** Escape LIKE wildcards so a search for "50%" means the characters, not a pattern. */
function likeContains(text: string): string {
	return `%${text.replace(/[\\%_]/g, (ch) => `\\${ch}`)}%`;
}

export function caseRepository(knex: Knex) {
	return {
		/**
		 * Cases matching the query. `memberOf` restricts to cases the user is a member of
		 * (clients); `involving` to cases the user created or is a member of (a technician's "mine").
		 */
		async list(
			query: CaseListQuery,
			scope: { memberOf?: number; involving?: number },
			trx: Knex = knex
		): Promise<CaseRow[]> {
			const q = baseQuery(trx);
			if (scope.memberOf !== undefined) {
				q.whereExists((sub) =>
					sub.select(trx.raw('1')).from('case_members as m').whereRaw('m.case_id = c.id').andWhere('m.user_id', scope.memberOf!)
				);
			}
			if (scope.involving !== undefined) {
				const userId = scope.involving;
				q.where((w) =>
					w.where('c.created_by', userId).orWhereExists((sub) =>
						sub.select(trx.raw('1')).from('case_members as m').whereRaw('m.case_id = c.id').andWhere('m.user_id', userId)
					)
				);
			}
			if (query.status) q.where('c.status', query.status);
			if (query.kind) q.where('c.kind', query.kind);
			if (query.q) {
				const pattern = likeContains(query.q);
				// Plain LIKE under the column's collation (case-insensitive). Knex's whereLike appends
				// COLLATE utf8_bin, which MariaDB rejects on utf8mb4 columns and which is case-sensitive.
				q.where((w) => w.where('c.title', 'like', pattern).orWhere('c.reference', 'like', pattern));
			}
			return q.orderBy(sortColumns[query.sort], query.dir).orderBy('c.id', query.dir).limit(query.limit);
		},

		async findById(id: number, trx: Knex = knex): Promise<CaseRow | undefined> {
			return baseQuery(trx).where('c.id', id).first();
		},

		async findByReference(reference: string, trx: Knex = knex): Promise<CaseRow | undefined> {
			return baseQuery(trx).where('c.reference', reference).first();
		},

		async insert(
			row: { title: string; reference: string; kind: CaseKind; description: string; createdBy: number; status?: CaseStatus },
			trx: Knex = knex
		): Promise<number> {
			const [id] = await trx('cases').insert({
				title: row.title,
				reference: row.reference,
				kind: row.kind,
				description: row.description || null,
				status: row.status ?? 'open',
				created_by: row.createdBy
			});
			return id;
		},

		async isMember(caseId: number, userId: number, trx: Knex = knex): Promise<boolean> {
			const row = await trx('case_members').where({ case_id: caseId, user_id: userId }).first();
			return Boolean(row);
		},

		async members(caseId: number, trx: Knex = knex): Promise<CaseMemberRow[]> {
			return trx('case_members as m')
				.join('users as u', 'u.id', 'm.user_id')
				.where('m.case_id', caseId)
				.select('u.id as userId', 'u.name', 'u.email', 'u.role', 'm.added_at as addedAt')
				.orderBy('u.name');
		},

		async setStatus(id: number, status: CaseStatus, trx: Knex = knex): Promise<void> {
			await trx('cases').where({ id }).update({ status, updated_at: trx.fn.now(3) });
		},

		/** Add a member; false when they already were one (the insert is then a no-op). */
		async addMember(caseId: number, userId: number, addedBy: number, trx: Knex = knex): Promise<boolean> {
			if (await trx('case_members').where({ case_id: caseId, user_id: userId }).first()) return false;
			await trx('case_members')
				.insert({ case_id: caseId, user_id: userId, added_by: addedBy })
				.onConflict(['case_id', 'user_id'])
				.ignore();
			return true;
		}
	};
}
