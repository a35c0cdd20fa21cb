import { json } from '@sveltejs/kit';
import { db } from '$lib/server/db';
import { apiCall } from '$lib/server/http';
import { storage } from '$lib/server/storage';
import { tiles } from '$lib/server/tiles';
import { tileService } from '$lib/server/tiles/tile.service';
import type { RequestHandler } from './$types';

/** The zoom view's tile pyramid: sizes and grid of each level (built on first request). */
export const GET: RequestHandler = ({ locals, params }) =>
	apiCall(async () => json(await tileService(db(), storage(), tiles()).manifest(locals.user!, Number(params.id))));
