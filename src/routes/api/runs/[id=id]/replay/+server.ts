import { json } from '@sveltejs/kit';
import { apiCall } from '$lib/server/http';
import { runs } from '$lib/server/runs';
import type { RequestHandler } from './$types';

/** 202: the replay is a new run; its outcome also shows on the replayed run as `latestReplay`. */
export const POST: RequestHandler = ({ locals, params }) =>
	apiCall(async () => {
		const replay = await runs().replay(locals.user!, Number(params.id));
		return json({ id: replay.id, status: replay.status, replayOf: replay.replayOf }, { status: 202, headers: { location: `/api/runs/${replay.id}` } });
	});
