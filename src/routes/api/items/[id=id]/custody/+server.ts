import { json } from '@sveltejs/kit';
import { systemClock } from '$lib/server/clock';
import { db } from '$lib/server/db';
import { apiCall } from '$lib/server/http';
import { custodyService } from '$lib/server/services/custody.service';
import { visibleItem } from '$lib/server/services/item-access';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = ({ locals, params }) =>
	apiCall(async () => {
		const item = await visibleItem(db(), locals.user!, Number(params.id));
		return json({ events: await custodyService(db(), systemClock).forItem(item.id) });
	});
