import { fail } from '@sveltejs/kit';
import { newTokenSchema, revokeTokenSchema } from '$lib/schemas/token';
import { db } from '$lib/server/db';
import { NotFoundError } from '$lib/server/errors';
import { fieldErrors } from '$lib/server/http';
import { apiTokenService } from '$lib/server/services/api-token.service';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => ({
	tokens: await apiTokenService(db()).list(locals.user!)
});

export const actions: Actions = {
	create: async ({ locals, request }) => {
		const parsed = newTokenSchema.safeParse(Object.fromEntries(await request.formData()));
		if (!parsed.success) return fail(400, { fields: fieldErrors(parsed.error.issues) });
		const { secret, token } = await apiTokenService(db()).create(locals.user!, parsed.data.name);
		return { created: { name: token.name, secret } };
	},
	revoke: async ({ locals, request }) => {
		const parsed = revokeTokenSchema.safeParse(Object.fromEntries(await request.formData()));
		if (!parsed.success) return fail(400, { fields: fieldErrors(parsed.error.issues) });
		const revoked = await apiTokenService(db())
			.revoke(locals.user!, parsed.data.id)
			.then(
				() => true,
				(err: unknown) => {
					if (err instanceof NotFoundError) return false;
					throw err;
				}
			);
		const notFound: Record<string, string[]> = { id: ['Unknown or already revoked token'] };
		return revoked ? { revoked: true } : fail(404, { fields: notFound });
	}
};
