import { json } from '@sveltejs/kit';
import { caseListQuerySchema, newCaseSchema } from '$lib/schemas/case';
import { db } from '$lib/server/db';
import { apiCall, parseWith, readJson, searchParamsObject } from '$lib/server/http';
import { caseService } from '$lib/server/services/case.service';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = ({ locals, url }) =>
	apiCall(async () => {
		const query = parseWith(caseListQuerySchema, searchParamsObject(url));
		return json({ cases: await caseService(db()).list(locals.user!, query) });
	});

export const POST: RequestHandler = ({ locals, request }) =>
	apiCall(async () => {
		const input = await readJson(request, newCaseSchema);
		return json({ case: await caseService(db()).create(locals.user!, input) }, { status: 201 });
	});
