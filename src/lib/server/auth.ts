/**
 * Sign-in with Auth.js: e-mail + password (credentials provider), JWT sessions carrying the
 * user id and role. The role is re-read from the database on every request (hooks.server.ts),
 * so a role change or a disabled account takes effect at once.
 */
import { randomUUID } from 'node:crypto';
import { SvelteKitAuth } from '@auth/sveltekit';
import Credentials from '@auth/sveltekit/providers/credentials';
import { config } from './config';
import { db } from './db';
import { redis } from './redis';
import { userService } from './services/user.service';
import { SESSION_MAX_AGE_SECONDS, sessionRevocation } from './session-revocation';
import { signInLimiter } from './sign-in-limiter';
import { signInSchema } from '../schemas/user';

export const { handle: authHandle, signIn, signOut } = SvelteKitAuth(async (event) => {
	const c = config();
	const limiter = signInLimiter(redis(), {
		maxFailures: c.SIGNIN_MAX_FAILURES,
		windowSeconds: c.SIGNIN_WINDOW_SECONDS,
		prefix: `${c.QUEUE_PREFIX}:signin-failures`
	});
	const users = userService(db(), limiter);
	return {
		trustHost: true,
		// A refused password is an expected event, not a server error worth a stack trace.
		logger: {
			error(err: Error) {
				if (err.name !== 'CredentialsSignin') console.error('[auth]', err);
			}
		},
		session: { strategy: 'jwt', maxAge: SESSION_MAX_AGE_SECONDS },
		pages: { signIn: '/signin', error: '/signin' },
		providers: [
			Credentials({
				credentials: { email: { type: 'email' }, password: { type: 'password' } },
				async authorize(credentials) {
					const parsed = signInSchema.safeParse(credentials);
					if (!parsed.success) return null;
					const user = await users.authenticate(parsed.data.email, parsed.data.password, event.getClientAddress());
					return user ? { id: String(user.id), name: user.name, email: user.email } : null;
				}
			})
		],
		callbacks: {
			jwt({ token, user }) {
				if (user?.id) {
					token.uid = Number(user.id);
					token.sid = randomUUID();
				}
				return token;
			},
			session({ session, token }) {
				return { ...session, uid: token.uid, sid: token.sid };
			}
		},
		events: {
			// A copy of the cookie taken before sign-out must not sign anyone in afterwards.
			async signOut(message) {
				const sid = 'token' in message ? message.token?.sid : undefined;
				if (typeof sid === 'string') await sessionRevocation(redis(), c.QUEUE_PREFIX).revoke(sid);
			}
		}
	};
});
