import { fail } from '@sveltejs/kit';
import { message, setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { z } from 'zod';
import { newUserSchema, setRoleSchema } from '$lib/schemas/user';
import { db } from '$lib/server/db';
import { ConflictError, DomainError } from '$lib/server/errors';
import { userService } from '$lib/server/services/user.service';
import type { Actions, PageServerLoad } from './$types';

const setRoleFormSchema = setRoleSchema.extend({ id: z.coerce.number().int().positive() });

// Start new accounts as technicians rather than the schema's first role (admin): granting
// administrator rights should be a deliberate choice, not an unchanged default.
export const load: PageServerLoad = async () => ({
	form: await superValidate({ role: 'technician' }, zod4(newUserSchema), { errors: false })
});

export const actions: Actions = {
	create: async ({ request }) => {
		const form = await superValidate(request, zod4(newUserSchema));
		if (!form.valid) return fail(400, { form });
		let name: string;
		try {
			name = (await userService(db()).create(form.data)).name;
		} catch (err) {
			if (err instanceof ConflictError) return setError(form, 'email', err.fields?.email?.[0] ?? err.message);
			throw err;
		}
		// The password never travels back to the browser, even to refill the form.
		form.data.password = '';
		return message(form, `Account created for ${name}.`);
	},

	setRole: async ({ request }) => {
		const raw = Object.fromEntries(await request.formData());
		const parsed = setRoleFormSchema.safeParse(raw);
		const id = Number(raw.id) || 0;
		if (!parsed.success) return fail(400, { roleError: { id, message: parsed.error.issues[0]?.message ?? 'Invalid role' } });
		try {
			await userService(db()).setRole(parsed.data.id, parsed.data.role);
		} catch (err) {
			if (!(err instanceof DomainError)) throw err;
			return fail(err.status, { roleError: { id, message: err.fields?.role?.[0] ?? err.message } });
		}
		return { roleChanged: id };
	}
};
