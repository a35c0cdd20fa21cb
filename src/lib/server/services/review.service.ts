/**
 * Technical review: a technician puts a succeeded run forward as an item's result, and a second
 * qualified person approves or returns it (ISO/IEC 17025:2017 §7.8.2.1 names who authorised a
 * report; common forensic QA practice has a second person do the technical review). The author
 * of the run, or of the proposal, never decides it. Decisions are final: an approved proposal is
 * frozen (a trigger enforces it), and new work is a new proposal.
 */
import type { Knex } from 'knex';
import type { SessionUser } from '../../roles';
import type { Clock } from '../clock';
import { ConflictError, ForbiddenError, NotFoundError } from '../errors';
import type { Mailer } from '../mail';
import { reportRepository } from '../repositories/report.repository';
import { proposalRepository, type ProposalRow, type ProposalStatus } from '../repositories/proposal.repository';
import { runRepository } from '../repositories/run.repository';
import { userRepository } from '../repositories/user.repository';
import { reviewNotices, type NoticeSubject } from '../review-notices';
import { custodyService } from './custody.service';
import { visibleItem } from './item-access';

export type ItemReviewState = 'in_progress' | Exclude<ProposalStatus, 'superseded'>;

const AUTHORS = ['admin', 'technician'];
const REVIEWERS = ['admin', 'supervisor'];

export const canSubmit = (user: SessionUser) => AUTHORS.includes(user.role);
export const canReview = (user: SessionUser) => REVIEWERS.includes(user.role);
/** Whoever ran the restoration or put it forward cannot be its second pair of eyes. */
export const isAuthorOf = (user: SessionUser, p: Pick<ProposalRow, 'runAuthorId' | 'submittedBy'>) =>
	user.id === p.runAuthorId || user.id === p.submittedBy;

const subjectOf = (p: ProposalRow): NoticeSubject => ({ proposalId: p.id, itemId: p.itemId, itemName: p.itemName, caseReference: p.caseReference });

export function reviewService(knex: Knex, deps: { clock: Clock; mailer: Mailer }) {
	const proposals = proposalRepository(knex);
	const runs = runRepository(knex);
	const custody = custodyService(knex, deps.clock);
	const notices = reviewNotices(deps.mailer);
	const actorOf = (user: SessionUser) => ({ id: user.id, role: user.role });

	async function visibleProposal(user: SessionUser, id: number): Promise<ProposalRow> {
		const proposal = await proposals.findById(id);
		// Clients never see the lab's proposals: to them there are none.
		if (!proposal || user.role === 'client') throw new NotFoundError('Proposal');
		await visibleItem(knex, user, proposal.itemId);
		return proposal;
	}

	async function emailOf(userId: number): Promise<string[]> {
		const user = await userRepository(knex).findById(userId);
		return user ? [user.email] : [];
	}

	async function decide(user: SessionUser, id: number, outcome: 'approved' | 'returned', comment: string): Promise<ProposalRow> {
		if (!canReview(user)) throw new ForbiddenError('Only supervisors and administrators review proposals');
		const proposal = await visibleProposal(user, id);
		if (isAuthorOf(user, proposal)) throw new ForbiddenError('The author of a run cannot review it: a second person must');
		const run = (await runs.findById(proposal.runId))!;
		await knex.transaction(async (trx) => {
			const decision = { by: user.id, at: deps.clock.now(), comment };
			if (!(await proposals.transition(proposal.id, 'awaiting_review', outcome, trx, decision))) {
				throw new ConflictError(`The proposal is no longer awaiting review (it is ${(await proposals.findById(proposal.id, trx))!.status})`);
			}
			await custody.record(
				{
					action: outcome === 'approved' ? 'review_approved' : 'review_returned',
					actor: actorOf(user),
					caseId: proposal.caseId,
					itemId: proposal.itemId,
					runId: proposal.runId,
					detail: { proposalId: proposal.id, comment },
					hashBefore: run.resultSha256,
					hashAfter: run.resultSha256
				},
				trx
			);
		});
		const decided = (await proposals.findById(proposal.id))!;
		const to = await emailOf(decided.submittedBy);
		if (outcome === 'approved') await notices.approved(to, subjectOf(decided), user.name, comment);
		else await notices.returned(to, subjectOf(decided), user.name, comment);
		return decided;
	}

	/** The item's state as the issue names it, from its newest proposal that still counts. */
	async function stateOfItem(itemId: number): Promise<{ state: ItemReviewState; current: ProposalRow | null; history: ProposalRow[] }> {
		const history = await proposals.listForItem(itemId);
		const current = history.find((p) => p.status !== 'superseded') ?? null;
		return { state: current ? (current.status as ItemReviewState) : 'in_progress', current, history };
	}

	return {
		get: visibleProposal,

		stateOfItem,

		async submit(user: SessionUser, runId: number, statement: string): Promise<ProposalRow> {
			if (!canSubmit(user)) throw new ForbiddenError('Only technicians and administrators put results forward');
			const run = await runs.findById(runId);
			if (!run) throw new NotFoundError('Run');
			await visibleItem(knex, user, run.itemId);
			if (run.status !== 'succeeded') throw new ConflictError('Only a succeeded run can be put forward for review');
			const id = await knex.transaction(async (trx) => {
				// A newer proposal replaces one still waiting; approved and released ones stay as they are.
				for (const open of await proposals.lockOpenForItem(run.itemId, trx)) {
					if (open.status === 'awaiting_review') await proposals.transition(open.id, 'awaiting_review', 'superseded', trx);
				}
				const proposalId = await proposals.insert({ itemId: run.itemId, runId: run.id, submittedBy: user.id, statement }, trx);
				await custody.record(
					{ action: 'review_submitted', actor: actorOf(user), caseId: run.caseId, itemId: run.itemId, runId: run.id, detail: { proposalId, statement }, hashAfter: run.resultSha256 },
					trx
				);
				return proposalId;
			});
			const proposal = (await proposals.findById(id))!;
			const supervisors = (await userRepository(knex).listByRole('supervisor')).map((u) => u.email);
			await notices.awaitingReview(supervisors, subjectOf(proposal), user.name);
			return proposal;
		},

		/** Proposals awaiting review, oldest first: the reviewer's queue. */
		async queue(user: SessionUser): Promise<ProposalRow[]> {
			if (!canReview(user)) throw new ForbiddenError('Only supervisors and administrators review proposals');
			return proposals.listByStatus(['awaiting_review']);
		},

		/** Approved proposals not yet released: what an administrator or supervisor can release. */
		async releasable(user: SessionUser): Promise<ProposalRow[]> {
			if (!canReview(user)) throw new ForbiddenError('Only supervisors and administrators release results');
			return proposals.listByStatus(['approved']);
		},

		/** What the submit page shows: the run, and the item's review state it would change. */
		async submission(user: SessionUser, runId: number) {
			if (!canSubmit(user)) throw new ForbiddenError('Only technicians and administrators put results forward');
			const run = await runs.findById(runId);
			if (!run) throw new NotFoundError('Run');
			const item = await visibleItem(knex, user, run.itemId);
			return { run, item, ...(await stateOfItem(item.id)) };
		},

		/** Everything the review page shows: before/after, kernel, parameters, pre-flight, custody. */
		async reviewPage(user: SessionUser, id: number) {
			const proposal = await visibleProposal(user, id);
			const item = await visibleItem(knex, user, proposal.itemId);
			const run = (await runs.findById(proposal.runId))!;
			const report = await reportRepository(knex).findByProposal(proposal.id);
			return {
				proposal,
				item,
				run,
				report: report ?? null,
				history: await proposals.listForItem(item.id),
				custody: await custody.forItem(item.id),
				mayDecide: canReview(user) && !isAuthorOf(user, proposal) && proposal.status === 'awaiting_review',
				mayRelease: canReview(user) && proposal.status === 'approved'
			};
		},

		approve: (user: SessionUser, id: number, comment: string) => decide(user, id, 'approved', comment),
		returnWithComment: (user: SessionUser, id: number, comment: string) => decide(user, id, 'returned', comment)
	};
}
