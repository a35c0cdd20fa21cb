import { apiCall } from '$lib/server/http';
import { portalFileResponse } from '$lib/server/portal-response';
import { releases } from '$lib/server/review';
import type { RequestHandler } from './$types';

/** The released report PDF as an attachment (404 before release); each download is a custody event. */
export const GET: RequestHandler = ({ locals, params }) => apiCall(async () => portalFileResponse(await releases().reportFile(locals.user!, Number(params.id))));
