import { isRedirect, redirect } from '@sveltejs/kit';
import { signOut } from '$lib/server/auth';
import type { Actions } from './$types';

export const actions: Actions = {
	// Auth.js clears the session cookie and answers 302; after a form POST the answer is 303.
	default: async (event) => {
		let outcome: unknown;
		try {
			await signOut(event);
		} catch (thrown) {
			outcome = thrown;
		}
		if (isRedirect(outcome)) redirect(303, '/signin');
		throw outcome ?? new Error('Sign-out ended without an answer');
	}
};
