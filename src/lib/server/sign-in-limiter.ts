/**
 * Counts failed sign-ins per e-mail and per client address in Redis (so every web process
 * shares the count) and refuses further attempts once either passes its limit for the window.
 * Limiting by both stops one address guessing many accounts and many addresses guessing one.
 */
import type { Redis } from 'ioredis';

export interface SignInLimiter {
	isBlocked(email: string, address: string): Promise<boolean>;
	recordFailure(email: string, address: string): Promise<void>;
	reset(email: string): Promise<void>;
}

export function signInLimiter(
	store: Redis,
	options: { maxFailures: number; windowSeconds: number; prefix?: string }
): SignInLimiter {
	const prefix = options.prefix ?? 'stillpoint:signin-failures';
	const emailKey = (email: string) => `${prefix}:email:${email.toLowerCase()}`;
	const addressKey = (address: string) => `${prefix}:address:${address}`;
	// An address may legitimately serve several people (a lab's NAT), so it gets more room.
	const addressLimit = options.maxFailures * 4;

	return {
		async isBlocked(email, address) {
			const [byEmail, byAddress] = await store.mget(emailKey(email), addressKey(address));
			return Number(byEmail ?? 0) >= options.maxFailures || Number(byAddress ?? 0) >= addressLimit;
		},
		async recordFailure(email, address) {
			await store
				.multi()
				.incr(emailKey(email))
				.expire(emailKey(email), options.windowSeconds)
				.incr(addressKey(address))
				.expire(addressKey(address), options.windowSeconds)
				.exec();
		},
		async reset(email) {
			await store.del(emailKey(email));
		}
	};
}
