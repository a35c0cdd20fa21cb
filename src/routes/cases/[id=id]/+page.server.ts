import { error, fail } from '@sveltejs/kit';
import { addMemberSchema } from '$lib/schemas/case';
import { db } from '$lib/server/db';
import { DomainError, NotFoundError } from '$lib/server/errors';
import { caseService } from '$lib/server/services/case.service';
import { itemJson, itemService } from '$lib/server/services/item.service';
import { storage } from '$lib/server/storage';
import { userService } from '$lib/server/services/user.service';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params }) => {
	const user = locals.user!;
	let detail;
	try {
		detail = await caseService(db()).detail(user, Number(params.id));
	} catch (err) {
		if (!(err instanceof NotFoundError)) throw err;
	}
	if (!detail) error(404, 'No such case, or it is not shared with you');

	const canAddMembers = user.role === 'admin' || user.role === 'technician';
	const memberIds = new Set(detail.members.map((m) => m.userId));
	// Only people not yet on the case are offered; the list is for the picker, not for display.
	const candidates = canAddMembers
		? (await userService(db()).list())
				.filter((u) => u.active && !memberIds.has(u.id))
				.map((u) => ({ id: u.id, name: u.name, role: u.role }))
		: [];

	const items = (await itemService(db(), storage()).listForCase(user, detail.case.id)).map((row) => itemJson(row, { withExif: false }));

	return { ...detail, canAddMembers, candidates, items, canUpload: canAddMembers };
};

export const actions: Actions = {
	addMember: async ({ locals, params, request }) => {
		const parsed = addMemberSchema.safeParse(Object.fromEntries(await request.formData()));
		if (!parsed.success) return fail(400, { memberError: parsed.error.issues[0]?.message ?? 'Choose a user' });

		let refusal: DomainError | undefined;
		try {
			await caseService(db()).addMember(locals.user!, Number(params.id), parsed.data.userId);
		} catch (err) {
			if (!(err instanceof DomainError)) throw err;
			refusal = err;
		}
		if (refusal instanceof NotFoundError) error(404, 'No such case, or it is not shared with you');
		if (refusal) return fail(refusal.status, { memberError: refusal.fields?.userId?.[0] ?? refusal.message });
		return { memberAdded: true };
	}
};
