import { error, json, redirect, type Handle, type HandleServerError } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { randomUUID } from 'node:crypto';
import { allowedMethods, decideAccess } from '$lib/server/access';
import { authHandle } from '$lib/server/auth';
import { closeDb, db } from '$lib/server/db';
import { config } from '$lib/server/config';
import { closeRedis, redis } from '$lib/server/redis';
import { sessionRevocation } from '$lib/server/session-revocation';
import { apiTokenService } from '$lib/server/services/api-token.service';
import { userService } from '$lib/server/services/user.service';

const FORM_TYPES = ['application/x-www-form-urlencoded', 'multipart/form-data', 'text/plain'];
const UNSAFE_METHODS = ['POST', 'PUT', 'PATCH', 'DELETE'];

/** Refuse cross-site form submissions riding on the session cookie (CSRF). */
const originHandle: Handle = async ({ event, resolve }) => {
	const { request, url } = event;
	const type = request.headers.get('content-type')?.split(';')[0].trim().toLowerCase() ?? '';
	const bearer = request.headers.get('authorization')?.startsWith('Bearer ') && url.pathname.startsWith('/api/');
	if (!bearer && UNSAFE_METHODS.includes(request.method) && FORM_TYPES.includes(type)) {
		if (request.headers.get('origin') !== url.origin) {
			return json({ error: `Cross-site ${request.method} form submissions are refused` }, { status: 403 });
		}
	}
	return resolve(event);
};

/**
 * Resolve the caller: a bearer token on API routes (automation), otherwise the session cookie.
 * Role and status are re-read from the database, so changes take effect at once.
 */
const userHandle: Handle = async ({ event, resolve }) => {
	const authorization = event.request.headers.get('authorization');
	if (authorization && event.url.pathname.startsWith('/api/')) {
		const [scheme, secret] = authorization.split(' ');
		event.locals.user = scheme === 'Bearer' && secret ? await apiTokenService(db()).authenticate(secret) : null;
		if (!event.locals.user) return json({ error: 'Unknown or revoked API token' }, { status: 401 });
		return resolve(event);
	}
	const session = (await event.locals.auth()) as { uid?: number; sid?: string } | null;
	// A session without an id predates sign-out revocation, or was not issued by this app: refused.
	const live =
		typeof session?.uid === 'number' &&
		typeof session.sid === 'string' &&
		!(await sessionRevocation(redis(), config().QUEUE_PREFIX).isRevoked(session.sid));
	event.locals.user = live ? await userService(db()).sessionUser(session.uid!) : null;
	return resolve(event);
};

/** Apply the route table: anonymous pages go to sign-in, anonymous API calls get 401, others 403. */
const guardHandle: Handle = async ({ event, resolve }) => {
	const routeId = event.route.id;
	if (routeId === null) return resolve(event); // no such route: SvelteKit answers 404
	const isApi = routeId.startsWith('/api/');
	const decision = decideAccess(routeId, event.request.method, event.locals.user?.role);
	if (decision === 'allow') return resolve(event);
	if (decision === 'method') {
		const allow = allowedMethods(routeId).join(', ');
		return json({ error: `${event.request.method} is not served here; use ${allow}` }, { status: 405, headers: { allow } });
	}
	if (decision === 'anonymous') {
		if (isApi) return json({ error: 'Sign in first' }, { status: 401 });
		const target = event.url.pathname + event.url.search;
		redirect(303, `/signin?redirectTo=${encodeURIComponent(target)}`);
	}
	const message = decision === 'unlisted' ? 'This route has no access rule' : 'Your role does not allow this';
	if (isApi) return json({ error: message }, { status: 403 });
	error(403, message);
};

export const handle = sequence(originHandle, authHandle, userHandle, guardHandle);

export const handleError: HandleServerError = ({ error: err, status, message }) => {
	const errorId = randomUUID();
	if (status >= 500) console.error(`[${errorId}]`, err);
	return { message: status >= 500 ? 'Something went wrong on our side' : message, errorId };
};

process.on('sveltekit:shutdown', async () => {
	await Promise.allSettled([closeDb(), closeRedis()]);
});
