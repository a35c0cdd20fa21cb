import { CredentialsSignin } from '@auth/sveltekit';
import { fail, isRedirect, redirect } from '@sveltejs/kit';
import { signInSchema } from '$lib/schemas/user';
import { signIn } from '$lib/server/auth';
import type { Actions, PageServerLoad } from './$types';

/** Only same-site paths, so the sign-in page cannot be used to bounce users elsewhere. */
function safeRedirect(target: string | null | undefined): string {
	return target && target.startsWith('/') && !target.startsWith('//') ? target : '/';
}

export const load: PageServerLoad = ({ locals, url }) => {
	const redirectTo = safeRedirect(url.searchParams.get('redirectTo') ?? url.searchParams.get('callbackUrl'));
	if (locals.user) redirect(303, redirectTo);
	return { redirectTo, failed: url.searchParams.has('error') };
};

export const actions: Actions = {
	default: async (event) => {
		const form = await event.request.clone().formData();
		const email = String(form.get('email') ?? '');
		const parsed = signInSchema.safeParse({ email, password: form.get('password') ?? '' });
		if (!parsed.success) {
			const fields: Record<string, string> = {};
			for (const issue of parsed.error.issues) fields[String(issue.path[0])] ??= issue.message;
			return fail(400, { email, fields });
		}
		// Auth.js checks the password and the failure limit. It answers success by throwing a
		// redirect to `redirectTo`, and every kind of refusal with one error: one generic message.
		let outcome: unknown;
		try {
			await signIn(event);
		} catch (thrown) {
			outcome = thrown;
		}
		if (isRedirect(outcome)) redirect(303, safeRedirect(form.get('redirectTo')?.toString()));
		if (outcome instanceof CredentialsSignin) return fail(401, { email, fields: {}, failed: true });
		throw outcome ?? new Error('Sign-in ended without an answer');
	}
};
