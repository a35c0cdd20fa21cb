import { json } from '@sveltejs/kit';
import { newTokenSchema } from '$lib/schemas/token';
import { db } from '$lib/server/db';
import { apiCall, readJson } from '$lib/server/http';
import { apiTokenService } from '$lib/server/services/api-token.service';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = ({ locals }) =>
	apiCall(async () => json({ tokens: await apiTokenService(db()).list(locals.user!) }));

/** The secret is in this response only; it is stored as a SHA-256 digest. */
export const POST: RequestHandler = ({ locals, request }) =>
	apiCall(async () => {
		const { name } = await readJson(request, newTokenSchema);
		return json(await apiTokenService(db()).create(locals.user!, name), { status: 201 });
	});
