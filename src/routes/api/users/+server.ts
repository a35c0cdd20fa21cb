import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { roleSchema, newUserSchema } from '$lib/schemas/user';
import { db } from '$lib/server/db';
import { apiCall, parseWith, readJson, searchParamsObject } from '$lib/server/http';
import { userService } from '$lib/server/services/user.service';
import type { RequestHandler } from './$types';

const listQuery = z.object({ role: roleSchema.optional() });

/** Staff read the user list (to pick case members); only administrators create users. */
export const GET: RequestHandler = ({ url }) =>
	apiCall(async () => {
		const { role } = parseWith(listQuery, searchParamsObject(url));
		const users = userService(db());
		return json({ users: role ? await users.listByRole(role) : await users.list() });
	});

export const POST: RequestHandler = ({ request }) =>
	apiCall(async () => {
		const input = await readJson(request, newUserSchema);
		return json({ user: await userService(db()).create(input) }, { status: 201 });
	});
