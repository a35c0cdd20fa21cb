/** Signing in over HTTP exactly as the sign-in form does without JavaScript. */
import type { Role } from '../../../src/lib/roles';
import { DEMO_USERS } from '../../../src/lib/server/demo/scenario';
import { HttpClient } from './http';

export interface SignInAttempt {
	status: number;
	location: string | null;
	html: string;
	client: HttpClient;
}

export async function attemptSignIn(email: string, password: string, redirectTo = '/'): Promise<SignInAttempt> {
	const client = new HttpClient();
	const response = await client.post('/signin', {
		form: { providerId: 'credentials', email, password, redirectTo }
	});
	return { status: response.status, location: response.headers.get('location'), html: await response.text(), client };
}

/** The text of the page's alert (the sign-in failure message), whitespace collapsed; null if none. */
export function alertText(html: string): string | null {
	const match = /<[a-z]+[^>]*\brole="alert"[^>]*>([\s\S]*?)<\/[a-z]+>/i.exec(html);
	return match ? match[1].replace(/<[^>]+>/g, '').replace(/\s+/g, ' ').trim() : null;
}

/** A signed-in client, or an error naming what the server answered instead. */
export async function signInAs(email: string, password: string): Promise<HttpClient> {
	const attempt = await attemptSignIn(email, password);
	if (attempt.status !== 303 || !attempt.client.hasCookies()) {
		throw new Error(`Sign-in as ${email} answered ${attempt.status} (expected 303 with a session cookie)`);
	}
	return attempt.client;
}

export function demoUser(role: Role) {
	const user = DEMO_USERS.find((u) => u.role === role);
	if (!user) throw new Error(`No demo user with role ${role}`);
	return user;
}

// Module state is per test file (vitest isolates files), so each file signs each role in once.
const sessions = new Map<Role, Promise<HttpClient>>();

/** The demo user of this role, signed in once per test file (bcrypt makes each sign-in ≈ 0.3 s). */
export function signIn(role: Role): Promise<HttpClient> {
	let session = sessions.get(role);
	if (!session) {
		const user = demoUser(role);
		session = signInAs(user.email, user.password);
		sessions.set(role, session);
	}
	return session;
}
