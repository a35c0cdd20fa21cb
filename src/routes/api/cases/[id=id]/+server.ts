import { json } from '@sveltejs/kit';
import { db } from '$lib/server/db';
import { apiCall } from '$lib/server/http';
import { caseService } from '$lib/server/services/case.service';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = ({ locals, params }) =>
	apiCall(async () => json(await caseService(db()).detail(locals.user!, Number(params.id))));
