import { apiCall } from '$lib/server/http';
import { portalFileResponse } from '$lib/server/portal-response';
import { portal } from '$lib/server/review';
import type { RequestHandler } from './$types';

/** The 16-bit TIFF result, as an attachment; each download is a custody event. Unreleased items answer 404. */
export const GET: RequestHandler = ({ locals, params }) =>
	apiCall(async () => portalFileResponse(await portal().download(locals.user!, Number(params.id), 'master')));
