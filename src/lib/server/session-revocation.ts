/**
 * Signed-out sessions. A JWT session lives in the browser's cookie, so signing out only deletes
 * that cookie; a copy taken earlier would stay valid until it expires. Each session therefore
 * carries a random id, and signing out lists that id in Redis for the rest of the session's
 * lifetime; the request hook refuses a listed id.
 */
import type { Redis } from 'ioredis';

export const SESSION_MAX_AGE_SECONDS = 12 * 60 * 60;

export function sessionRevocation(redis: Redis, prefix: string) {
	const key = (sid: string) => `${prefix}:revoked-session:${sid}`;
	return {
		async revoke(sid: string): Promise<void> {
			await redis.set(key(sid), '1', 'EX', SESSION_MAX_AGE_SECONDS);
		},
		async isRevoked(sid: string): Promise<boolean> {
			return (await redis.exists(key(sid))) === 1;
		}
	};
}
