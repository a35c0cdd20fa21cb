import { regionQuerySchema } from '$lib/schemas/tiles';
import { db } from '$lib/server/db';
import { apiCall, parseWith, searchParamsObject } from '$lib/server/http';
import { storage } from '$lib/server/storage';
import { displayPngResponse, tiles } from '$lib/server/tiles';
import { tileService } from '$lib/server/tiles/tile.service';
import type { RequestHandler } from './$types';

/** A full-resolution crop of the original as 8-bit sRGB display values (PNG), each side ≤ 1024. */
export const GET: RequestHandler = ({ locals, params, url }) =>
	apiCall(async () => {
		const rect = parseWith(regionQuerySchema, searchParamsObject(url));
		const bytes = await tileService(db(), storage(), tiles()).region(locals.user!, Number(params.id), rect);
		return displayPngResponse(bytes);
	});
