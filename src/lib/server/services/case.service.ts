/** Rules for cases: who sees which, who may create them, who may add members. */
import type { Knex } from 'knex';
import { STAFF_ROLES, type SessionUser } from '../../roles';
import type { CaseListQuery, NewCase } from '../../schemas/case';
import { systemClock, type Clock } from '../clock';
import { ConflictError, ForbiddenError, InvalidError, NotFoundError } from '../errors';
import { caseRepository, type CaseMemberRow, type CaseRow } from '../repositories/case.repository';
import { userRepository } from '../repositories/user.repository';
import { custodyService } from './custody.service';

const isStaff = (user: SessionUser) => STAFF_ROLES.includes(user.role);
const canEditCases = (user: SessionUser) => user.role === 'admin' || user.role === 'technician';

export function caseService(knex: Knex, clock: Clock = systemClock) {
	const cases = caseRepository(knex);
	const users = userRepository(knex);
	const custody = custodyService(knex, clock);

	async function visibleCase(user: SessionUser, caseId: number): Promise<CaseRow> {
		const found = await cases.findById(caseId);
		// A client asking for a case they are not a member of learns nothing, not even that it exists.
		if (!found || (!isStaff(user) && !(await cases.isMember(caseId, user.id)))) {
			throw new NotFoundError('Case');
		}
		return found;
	}

	return {
		/** Staff list every case; clients only the cases they are members of. */
		list(user: SessionUser, query: CaseListQuery): Promise<CaseRow[]> {
			return cases.list(query, {
				memberOf: isStaff(user) ? undefined : user.id,
				involving: query.mine ? user.id : undefined
			});
		},

		get: visibleCase,

		async detail(user: SessionUser, caseId: number): Promise<{ case: CaseRow; members: CaseMemberRow[] }> {
			const found = await visibleCase(user, caseId);
			return { case: found, members: await cases.members(caseId) };
		},

		async create(user: SessionUser, input: NewCase): Promise<CaseRow> {
			if (!canEditCases(user)) throw new ForbiddenError('Only technicians and administrators open cases');
			return knex.transaction(async (trx) => {
				if (await cases.findByReference(input.reference, trx)) {
					throw new ConflictError('A case with this reference already exists', {
						reference: ['A case with this reference already exists']
					});
				}
				const id = await cases.insert({ ...input, createdBy: user.id }, trx);
				await custody.record(
					{
						action: 'case_created',
						actor: { id: user.id, role: user.role },
						caseId: id,
						detail: { reference: input.reference, title: input.title, kind: input.kind }
					},
					trx
				);
				return (await cases.findById(id, trx))!;
			});
		},

		async addMember(user: SessionUser, caseId: number, memberId: number): Promise<void> {
			if (!canEditCases(user)) throw new ForbiddenError('Only technicians and administrators add members');
			await visibleCase(user, caseId);
			const member = await users.findById(memberId);
			if (!member || !member.active) throw new InvalidError('Unknown user', { userId: ['Unknown user'] });
			await knex.transaction(async (trx) => {
				if (!(await cases.addMember(caseId, memberId, user.id, trx))) return;
				await custody.record(
					{
						action: 'case_member_added',
						actor: { id: user.id, role: user.role },
						caseId,
						detail: { memberId, memberRole: member.role }
					},
					trx
				);
			});
		}
	};
}
