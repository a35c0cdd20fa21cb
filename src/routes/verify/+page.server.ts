import { fail } from '@sveltejs/kit';
import { superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { verifyByFileSchema, verifyByIdSchema } from '$lib/schemas/review';
import { fieldErrors } from '$lib/server/http';
import { verifier } from '$lib/server/review';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => ({ idForm: await superValidate(zod4(verifyByIdSchema), { id: 'by-id' }) });

export const actions: Actions = {
	byId: async ({ request }) => {
		const idForm = await superValidate(request, zod4(verifyByIdSchema), { id: 'by-id' });
		if (!idForm.valid) return fail(400, { idForm });
		return { idForm, outcome: await verifier().byReportId(idForm.data.reportId) };
	},
	byFile: async ({ request }) => {
		const parsed = verifyByFileSchema.safeParse({ file: (await request.formData()).get('file') });
		if (!parsed.success) return fail(400, { fileErrors: fieldErrors(parsed.error.issues).file ?? [] });
		return { outcome: await verifier().byPdf(Buffer.from(await parsed.data.file.arrayBuffer())) };
	}
};
