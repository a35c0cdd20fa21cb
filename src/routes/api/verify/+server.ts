import { json } from '@sveltejs/kit';
import { apiCall, HttpError, readJson } from '$lib/server/http';
import { verifier } from '$lib/server/review';
import { verifyByIdSchema } from '$lib/schemas/review';
import type { RequestHandler } from './$types';

/** Public: `{reportId}` as JSON, or the PDF itself as an application/pdf body. */
export const POST: RequestHandler = ({ request }) =>
	apiCall(async () => {
		if (request.headers.get('content-type')?.startsWith('application/pdf')) {
			const bytes = Buffer.from(await request.arrayBuffer());
			if (bytes.length === 0) throw new HttpError(400, 'Send the report PDF as the body', { '': ['The body is empty'] });
			return json(await verifier().byPdf(bytes));
		}
		const { reportId } = await readJson(request, verifyByIdSchema);
		return json(await verifier().byReportId(reportId));
	});
