import { json } from '@sveltejs/kit';
import { estimateRequestSchema } from '$lib/schemas/estimate';
import { db } from '$lib/server/db';
import { apiCall, readJson } from '$lib/server/http';
import { estimateService } from '$lib/server/services/estimate.service';
import { storage } from '$lib/server/storage';
import type { RequestHandler } from './$types';

/** Blur-kernel proposals for an item (or a region of it), computed on request and not stored. */
export const POST: RequestHandler = ({ locals, params, request }) =>
	apiCall(async () => {
		const input = await readJson(request, estimateRequestSchema);
		return json(await estimateService(db(), storage()).estimate(locals.user!, Number(params.id), input));
	});
