import { apiCall } from '$lib/server/http';
import { portalPictureResponse } from '$lib/server/portal-response';
import { portal } from '$lib/server/review';
import type { RequestHandler } from './$types';

/** The after picture of the read-only viewer; recorded with the page view. Unreleased items answer 404. */
export const GET: RequestHandler = ({ locals, params }) =>
	apiCall(async () => portalPictureResponse(await portal().picture(locals.user!, Number(params.id), 'after')));
