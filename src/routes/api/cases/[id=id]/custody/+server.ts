import { json } from '@sveltejs/kit';
import { systemClock } from '$lib/server/clock';
import { db } from '$lib/server/db';
import { apiCall } from '$lib/server/http';
import { caseService } from '$lib/server/services/case.service';
import { custodyService } from '$lib/server/services/custody.service';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = ({ locals, params }) =>
	apiCall(async () => {
		const found = await caseService(db()).get(locals.user!, Number(params.id));
		return json({ events: await custodyService(db(), systemClock).forCase(found.id) });
	});
