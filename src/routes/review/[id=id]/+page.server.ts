import { error, fail, redirect } from '@sveltejs/kit';
import { setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { approveSchema, returnSchema } from '$lib/schemas/review';
import { DomainError, NotFoundError } from '$lib/server/errors';
import { releases, reviews } from '$lib/server/review';
import { kernelSha256 } from '$lib/server/services/release.service';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params }) => {
	let page;
	try {
		page = await reviews().reviewPage(locals.user!, Number(params.id));
	} catch (err) {
		if (!(err instanceof NotFoundError)) throw err;
	}
	if (!page) error(404, 'No such proposal');
	const { proposal, item, run, report } = page;
	return {
		proposal: {
			id: proposal.id,
			status: proposal.status,
			statement: proposal.statement,
			author: proposal.submittedByName,
			createdAt: proposal.createdAt,
			decidedBy: proposal.decidedByName,
			decidedAt: proposal.decidedAt,
			decisionComment: proposal.decisionComment
		},
		item: { id: item.id, caseId: item.caseId, caseReference: proposal.caseReference, originalName: item.originalName, sha256: item.sha256, width: item.width, height: item.height, bitDepth: item.bitDepth, analysis: item.analysis },
		run: { id: run.id, method: run.method, psf: run.psf, params: run.params, engineVersion: run.engineVersion, resultSha256: run.resultSha256, requestedBy: run.requestedByName, finishedAt: run.finishedAt, recoverability: (run.record?.recoverability ?? null) as { lostFraction: number; note: string } | null, kernelSha256: kernelSha256(run.psf) },
		report: report ? { reportId: report.reportId, pdfSha256: report.pdfSha256, releasedAt: report.releasedAt, releasedBy: report.releasedByName } : null,
		history: page.history.map((p) => ({ id: p.id, status: p.status, author: p.submittedByName, createdAt: p.createdAt, decisionComment: p.decisionComment, runId: p.runId })),
		custody: page.custody.map((e) => ({ id: e.id, occurredAt: e.occurredAt, actor: e.actorName ?? 'system', role: e.actorRole, action: e.action })),
		mayDecide: page.mayDecide,
		mayRelease: page.mayRelease,
		approveForm: await superValidate(zod4(approveSchema), { id: 'approve' }),
		returnForm: await superValidate(zod4(returnSchema), { id: 'return' })
	};
};

/** A refusal from the service shown on the form that asked; other failures propagate. */
async function attempt<T>(form: T & { valid: boolean }, run: () => Promise<unknown>) {
	try {
		await run();
		return null;
	} catch (err) {
		if (err instanceof DomainError) return setError(form as never, err.message, { status: err.status });
		throw err;
	}
}

export const actions: Actions = {
	approve: async ({ locals, params, request }) => {
		const form = await superValidate(request, zod4(approveSchema), { id: 'approve' });
		if (!form.valid) return fail(400, { approveForm: form });
		const refused = await attempt(form, () => reviews().approve(locals.user!, Number(params.id), form.data.comment));
		if (refused) return refused;
		redirect(303, `/review/${params.id}`);
	},
	return: async ({ locals, params, request }) => {
		const form = await superValidate(request, zod4(returnSchema), { id: 'return' });
		if (!form.valid) return fail(400, { returnForm: form });
		const refused = await attempt(form, () => reviews().returnWithComment(locals.user!, Number(params.id), form.data.comment));
		if (refused) return refused;
		redirect(303, `/review/${params.id}`);
	},
	release: async ({ locals, params }) => {
		try {
			await releases().release(locals.user!, Number(params.id));
		} catch (err) {
			if (err instanceof DomainError) return fail(err.status, { releaseError: err.message });
			throw err;
		}
		redirect(303, `/review/${params.id}`);
	}
};
