import { fail, redirect } from '@sveltejs/kit';
import { setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { newCaseSchema } from '$lib/schemas/case';
import { db } from '$lib/server/db';
import { ConflictError } from '$lib/server/errors';
import { caseService } from '$lib/server/services/case.service';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => ({ form: await superValidate(zod4(newCaseSchema)) });

export const actions: Actions = {
	default: async ({ locals, request }) => {
		const form = await superValidate(request, zod4(newCaseSchema));
		if (!form.valid) return fail(400, { form });

		let id: number;
		try {
			id = (await caseService(db()).create(locals.user!, form.data)).id;
		} catch (err) {
			if (err instanceof ConflictError) return setError(form, 'reference', err.fields?.reference?.[0] ?? err.message);
			throw err;
		}
		redirect(303, `/cases/${id}`);
	}
};
