import { json } from '@sveltejs/kit';
import { db } from '$lib/server/db';
import { apiCall } from '$lib/server/http';
import { itemJson, itemService } from '$lib/server/services/item.service';
import { storage } from '$lib/server/storage';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = ({ locals, params }) =>
	apiCall(async () => {
		const item = await itemService(db(), storage()).get(locals.user!, Number(params.id));
		return json(itemJson(item, { withExif: true }));
	});
