import { json } from '@sveltejs/kit';
import { newRunSchema } from '$lib/schemas/run';
import { apiCall, readJson } from '$lib/server/http';
import { runs } from '$lib/server/runs';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = ({ locals, params }) =>
	apiCall(async () => json({ runs: await runs().listForItem(locals.user!, Number(params.id)) }));

/** 202: the run is queued; follow it at GET /api/runs/{id}. */
export const POST: RequestHandler = ({ locals, params, request }) =>
	apiCall(async () => {
		const input = await readJson(request, newRunSchema);
		const run = await runs().create(locals.user!, Number(params.id), input);
		return json({ id: run.id, status: run.status }, { status: 202, headers: { location: `/api/runs/${run.id}` } });
	});
