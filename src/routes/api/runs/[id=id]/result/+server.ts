import { fileResponse } from '$lib/server/file-response';
import { apiCall } from '$lib/server/http';
import { runs } from '$lib/server/runs';
import type { RequestHandler } from './$types';

/** The 16-bit TIFF master, as an attachment; each download is a custody event. */
export const GET: RequestHandler = ({ locals, params }) =>
	apiCall(async () => fileResponse(await runs().download(locals.user!, Number(params.id)), 'image/tiff', 'attachment'));
