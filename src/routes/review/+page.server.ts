import { reviews } from '$lib/server/review';
import type { PageServerLoad } from './$types';

const row = (p: Awaited<ReturnType<ReturnType<typeof reviews>['queue']>>[number]) => ({
	id: p.id,
	caseId: p.caseId,
	caseReference: p.caseReference,
	itemName: p.itemName,
	author: p.submittedByName,
	runId: p.runId,
	createdAt: p.createdAt,
	decidedBy: p.decidedByName
});

export const load: PageServerLoad = async ({ locals }) => {
	const service = reviews();
	return {
		awaiting: (await service.queue(locals.user!)).map(row),
		releasable: (await service.releasable(locals.user!)).map(row),
		now: Date.now()
	};
};
