import { error, json, redirect, type Handle, type HandleServerError } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { randomUUID } from 'node:crypto';
import { decideAccess } from '$lib/server/access';
import { authHandle } from '$lib/server/auth';
import { closeDb, db } from '$lib/server/db';
import { closeRedis } from '$lib/server/redis';
import { userService } from '$lib/server/services/user.service';

/** Resolve the signed-in user from the session, re-reading role and status from the database. */
const userHandle: Handle = async ({ event, resolve }) => {
	const session = (await event.locals.auth()) as { uid?: number } | null;
	event.locals.user = typeof session?.uid === 'number' ? await userService(db()).sessionUser(session.uid) : null;
	return resolve(event);
};

/** Apply the route table: anonymous pages go to sign-in, anonymous API calls get 401, others 403. */
const guardHandle: Handle = async ({ event, resolve }) => {
	const routeId = event.route.id;
	if (routeId === null) return resolve(event); // no such route: SvelteKit answers 404
	const isApi = routeId.startsWith('/api/');
	const decision = decideAccess(routeId, event.request.method, event.locals.user?.role);
	if (decision === 'allow') return resolve(event);
	if (decision === 'anonymous') {
		if (isApi) return json({ error: 'Sign in first' }, { status: 401 });
		const target = event.url.pathname + event.url.search;
		redirect(303, `/signin?redirectTo=${encodeURIComponent(target)}`);
	}
	const message = decision === 'unlisted' ? 'This route has no access rule' : 'Your role does not allow this';
	if (isApi) return json({ error: message }, { status: 403 });
	error(403, message);
};

export const handle = sequence(authHandle, userHandle, guardHandle);

export const handleError: HandleServerError = ({ error: err, status, message }) => {
	const errorId = randomUUID();
	if (status >= 500) console.error(`[${errorId}]`, err);
	return { message: status >= 500 ? 'Something went wrong on our side' : message, errorId };
};

process.on('sveltekit:shutdown', async () => {
	await Promise.allSettled([closeDb(), closeRedis()]);
});
