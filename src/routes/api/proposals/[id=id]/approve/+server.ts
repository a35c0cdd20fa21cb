import { json } from '@sveltejs/kit';
import { apiCall, readJson } from '$lib/server/http';
import { proposalJson } from '$lib/server/proposal-json';
import { reviews } from '$lib/server/review';
import { approveSchema } from '$lib/schemas/review';
import type { RequestHandler } from './$types';

/** Approve: refused (403) to the run's author and the proposal's submitter. */
export const POST: RequestHandler = ({ locals, params, request }) =>
	apiCall(async () => {
		const { comment } = await readJson(request, approveSchema);
		return json(proposalJson(await reviews().approve(locals.user!, Number(params.id), comment)));
	});
