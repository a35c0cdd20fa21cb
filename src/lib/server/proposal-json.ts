/** What the API answers for a proposal. */
import type { ProposalRow } from './repositories/proposal.repository';

export function proposalJson(p: ProposalRow) {
	return {
		id: p.id,
		itemId: p.itemId,
		caseId: p.caseId,
		caseReference: p.caseReference,
		itemName: p.itemName,
		runId: p.runId,
		submittedBy: { id: p.submittedBy, name: p.submittedByName },
		statement: p.statement,
		status: p.status,
		decidedBy: p.decidedBy === null ? null : { id: p.decidedBy, name: p.decidedByName },
		decidedAt: p.decidedAt,
		decisionComment: p.decisionComment,
		createdAt: p.createdAt
	};
}
