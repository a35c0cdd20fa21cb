import { json } from '@sveltejs/kit';
import { apiCall, readJson } from '$lib/server/http';
import { proposalJson } from '$lib/server/proposal-json';
import { reviews } from '$lib/server/review';
import { returnSchema } from '$lib/schemas/review';
import type { RequestHandler } from './$types';

/** Return to the technician; the comment saying what must change is required. */
export const POST: RequestHandler = ({ locals, params, request }) =>
	apiCall(async () => {
		const { comment } = await readJson(request, returnSchema);
		return json(proposalJson(await reviews().returnWithComment(locals.user!, Number(params.id), comment)));
	});
