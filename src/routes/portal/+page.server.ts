import { portal } from '$lib/server/review';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => ({
	released: (await portal().list(locals.user!)).map((r) => ({
		itemId: r.itemId,
		itemName: r.itemName,
		caseReference: r.caseReference,
		caseTitle: r.caseTitle,
		reportId: r.reportId,
		releasedAt: r.releasedAt
	}))
});
