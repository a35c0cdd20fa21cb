import { tilePositionSchema } from '$lib/schemas/tiles';
import { db } from '$lib/server/db';
import { apiCall, parseWith } from '$lib/server/http';
import { storage } from '$lib/server/storage';
import { displayPngResponse, tiles } from '$lib/server/tiles';
import { tileService } from '$lib/server/tiles/tile.service';
import type { RequestHandler } from './$types';

/** One 8-bit sRGB PNG tile; 400 for a malformed position, 404 outside the level's grid. */
export const GET: RequestHandler = ({ locals, params }) =>
	apiCall(async () => {
		const position = parseWith(tilePositionSchema, { level: params.level, column: params.column, row: params.row });
		const bytes = await tileService(db(), storage(), tiles()).tile(locals.user!, Number(params.id), position);
		return displayPngResponse(bytes);
	});
