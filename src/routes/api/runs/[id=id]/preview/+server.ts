import { fileResponse } from '$lib/server/file-response';
import { apiCall } from '$lib/server/http';
import { runs } from '$lib/server/runs';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = ({ locals, params }) =>
	apiCall(async () => fileResponse(await runs().preview(locals.user!, Number(params.id)), 'image/png', 'inline'));
