import { error, fail } from '@sveltejs/kit';
import { setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { STAFF_ROLES, type SessionUser } from '$lib/roles';
import { newRunSchema } from '$lib/schemas/run';
import { db } from '$lib/server/db';
import { DomainError, NotFoundError } from '$lib/server/errors';
import { PREVIEW_EDGE } from '$lib/server/intake/preview';
import { runs } from '$lib/server/runs';
import { caseService } from '$lib/server/services/case.service';
import { itemJson, itemService } from '$lib/server/services/item.service';
import { storage } from '$lib/server/storage';
import { formFieldOf, runFormSchema, toNewRun } from '$lib/workbench/run-form';
import type { Actions, PageServerLoad } from './$types';

const canRun = (user: SessionUser) => user.role === 'admin' || user.role === 'technician';

/** The item, only when it belongs to the case in the address and the caller may see that case. */
async function itemInCase(user: SessionUser, caseId: number, itemId: number) {
	let item;
	try {
		item = await itemService(db(), storage()).get(user, itemId);
	} catch (err) {
		if (!(err instanceof NotFoundError)) throw err;
	}
	return item && item.caseId === caseId ? item : undefined;
}

export const load: PageServerLoad = async ({ locals, params }) => {
	const user = locals.user!;
	const item = await itemInCase(user, Number(params.id), Number(params.itemId));
	if (!item) error(404, 'No such original in this case, or it is not shared with you');

	const record = await caseService(db()).get(user, item.caseId);
	const runList = STAFF_ROLES.includes(user.role) ? await runs().listForItem(user, item.id) : [];
	return {
		case: { id: record.id, reference: record.reference, title: record.title },
		item: itemJson(item, { withExif: false }),
		runs: runList,
		previewEdge: PREVIEW_EDGE,
		canRun: canRun(user),
		seesRuns: STAFF_ROLES.includes(user.role),
		form: await superValidate(zod4(runFormSchema))
	};
};

export const actions: Actions = {
	/** Queue a full-resolution run: the form's fields, checked again with the API's own schema, through the run service. */
	queue: async ({ locals, params, request }) => {
		const user = locals.user!;
		const form = await superValidate(request, zod4(runFormSchema));
		if (!form.valid) return fail(400, { form });

		const parsed = newRunSchema.safeParse(toNewRun(form.data));
		if (!parsed.success) {
			for (const issue of parsed.error.issues) {
				const field = formFieldOf(issue.path.join('.'));
				setError(form, field ?? '', issue.message);
			}
			return fail(400, { form });
		}

		const item = await itemInCase(user, Number(params.id), Number(params.itemId));
		if (!item) error(404, 'No such original in this case, or it is not shared with you');

		let refusal: DomainError | undefined;
		let queued: number | undefined;
		try {
			queued = (await runs().create(user, item.id, parsed.data)).id;
		} catch (err) {
			if (!(err instanceof DomainError)) throw err;
			refusal = err;
		}
		if (refusal) return setError(form, '', refusal.message, { status: refusal.status });
		return { form, queued };
	}
};
