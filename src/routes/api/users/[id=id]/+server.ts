import { json } from '@sveltejs/kit';
import { setRoleSchema } from '$lib/schemas/user';
import { db } from '$lib/server/db';
import { apiCall, readJson } from '$lib/server/http';
import { userService } from '$lib/server/services/user.service';
import type { RequestHandler } from './$types';

export const PATCH: RequestHandler = ({ params, request }) =>
	apiCall(async () => {
		const { role } = await readJson(request, setRoleSchema);
		return json({ user: await userService(db()).setRole(Number(params.id), role) });
	});
