import { json } from '@sveltejs/kit';
import { apiCall } from '$lib/server/http';
import { releases } from '$lib/server/review';
import type { RequestHandler } from './$types';

/** Release an approved proposal to the case's client members: renders and records the report. */
export const POST: RequestHandler = ({ locals, params }) =>
	apiCall(async () => {
		const report = await releases().release(locals.user!, Number(params.id));
		return json({ reportId: report.reportId, pdfSha256: report.pdfSha256, itemId: report.itemId, releasedAt: report.releasedAt }, { status: 201 });
	});
