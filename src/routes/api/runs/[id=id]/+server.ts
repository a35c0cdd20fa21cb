import { json } from '@sveltejs/kit';
import { apiCall } from '$lib/server/http';
import { runs } from '$lib/server/runs';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = ({ locals, params }) =>
	apiCall(async () => json(await runs().get(locals.user!, Number(params.id))));
