import { json } from '@sveltejs/kit';
import { db } from '$lib/server/db';
import { apiCall } from '$lib/server/http';
import { apiTokenService } from '$lib/server/services/api-token.service';
import type { RequestHandler } from './$types';

export const DELETE: RequestHandler = ({ locals, params }) =>
	apiCall(async () => {
		await apiTokenService(db()).revoke(locals.user!, Number(params.id));
		return json({ revoked: true });
	});
