import { json } from '@sveltejs/kit';
import { apiCall } from '$lib/server/http';
import { proposalJson } from '$lib/server/proposal-json';
import { reviews } from '$lib/server/review';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = ({ locals, params }) =>
	apiCall(async () => json(proposalJson(await reviews().get(locals.user!, Number(params.id)))));
