import { error } from '@sveltejs/kit';
import { NotFoundError } from '$lib/server/errors';
import { portal } from '$lib/server/review';
import type { PageServerLoad } from './$types';

/** Each load is a custody event: the ledger records that the client saw the released result. */
export const load: PageServerLoad = async ({ locals, params }) => {
	let found;
	try {
		found = await portal().view(locals.user!, Number(params.id));
	} catch (err) {
		if (!(err instanceof NotFoundError)) throw err;
	}
	if (!found) error(404, 'Nothing has been released to you under this address');
	const { item, report, run } = found;
	return {
		item: { id: item.id, originalName: item.originalName, sha256: item.sha256 },
		report: { reportId: report.reportId, pdfSha256: report.pdfSha256, releasedAt: report.releasedAt, releasedBy: report.releasedByName },
		run: { id: run.id, method: run.method, resultSha256: run.resultSha256! }
	};
};
