import { error, fail, redirect } from '@sveltejs/kit';
import { setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { submitProposalSchema } from '$lib/schemas/review';
import { DomainError, NotFoundError } from '$lib/server/errors';
import { reviews } from '$lib/server/review';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params }) => {
	let found;
	try {
		found = await reviews().submission(locals.user!, Number(params.id));
	} catch (err) {
		if (!(err instanceof NotFoundError)) throw err;
	}
	if (!found) error(404, 'No such run');
	const { run, item, state, current } = found;
	return {
		run: { id: run.id, status: run.status, method: run.method, params: run.params, resultSha256: run.resultSha256, requestedBy: run.requestedByName },
		item: { id: item.id, caseId: item.caseId, originalName: item.originalName },
		state,
		current: current ? { id: current.id, runId: current.runId, decisionComment: current.decisionComment } : null,
		form: await superValidate(zod4(submitProposalSchema))
	};
};

export const actions: Actions = {
	default: async ({ locals, params, request }) => {
		const form = await superValidate(request, zod4(submitProposalSchema));
		if (!form.valid) return fail(400, { form });
		let proposalId: number;
		try {
			proposalId = (await reviews().submit(locals.user!, Number(params.id), form.data.statement)).id;
		} catch (err) {
			if (err instanceof DomainError) return setError(form, err.message, { status: err.status });
			throw err;
		}
		redirect(303, `/review/${proposalId}`);
	}
};
