import { json } from '@sveltejs/kit';
import { apiCall, readJson } from '$lib/server/http';
import { proposalJson } from '$lib/server/proposal-json';
import { reviews } from '$lib/server/review';
import { submitProposalSchema } from '$lib/schemas/review';
import type { RequestHandler } from './$types';

/** Put a succeeded run forward for review, with the technician's statement. */
export const POST: RequestHandler = ({ locals, params, request }) =>
	apiCall(async () => {
		const { statement } = await readJson(request, submitProposalSchema);
		return json(proposalJson(await reviews().submit(locals.user!, Number(params.id), statement)), { status: 201 });
	});
