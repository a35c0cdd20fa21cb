/** Rules for accounts: sign-in, creation and role changes. */
import type { Knex } from 'knex';
import type { Role, SessionUser } from '../../roles';
import type { NewUser } from '../../schemas/user';
import { ConflictError, NotFoundError } from '../errors';
import { hashPassword, verifyPassword } from '../passwords';
import { userRepository, type UserRow } from '../repositories/user.repository';
import type { SignInLimiter } from '../sign-in-limiter';

// Compared against when the e-mail is unknown, so both failures take the same time.
const UNKNOWN_USER_HASH = '$2b$12$Uv8kpDT85CEMYgsqZzvqv.mKxWuGeiw9BVF8DQJTxQZoIM6LX8QUu';

export function userService(knex: Knex, limiter?: SignInLimiter) {
	const users = userRepository(knex);

	return {
		/**
		 * The user for these credentials, or null. Unknown e-mail, wrong password, a disabled
		 * account and too many recent failures all give the same null: one generic answer.
		 */
		async authenticate(email: string, password: string, address: string): Promise<SessionUser | null> {
			const normalised = email.trim().toLowerCase();
			if (limiter && (await limiter.isBlocked(normalised, address))) return null;
			const user = await users.findByEmailWithHash(normalised);
			const ok = await verifyPassword(password, user?.passwordHash ?? UNKNOWN_USER_HASH);
			if (!user || !ok || !user.active) {
				await limiter?.recordFailure(normalised, address);
				return null;
			}
			await limiter?.reset(normalised);
			return { id: user.id, name: user.name, email: user.email, role: user.role };
		},

		async sessionUser(id: number): Promise<SessionUser | null> {
			const user = await users.findById(id);
			if (!user || !user.active) return null;
			return { id: user.id, name: user.name, email: user.email, role: user.role };
		},

		list(): Promise<UserRow[]> {
			return users.list();
		},

		listByRole(role: Role): Promise<UserRow[]> {
			return users.listByRole(role);
		},

		async create(input: NewUser): Promise<UserRow> {
			if (await users.findByEmailWithHash(input.email)) {
				throw new ConflictError('A user with this e-mail already exists', {
					email: ['A user with this e-mail already exists']
				});
			}
			const id = await users.insert({
				name: input.name,
				email: input.email,
				role: input.role,
				passwordHash: await hashPassword(input.password)
			});
			return (await users.findById(id))!;
		},

		/** Change a role; the last administrator cannot be demoted (nobody could undo it). */
		async setRole(id: number, role: Role): Promise<UserRow> {
			return knex.transaction(async (trx) => {
				const user = await users.findById(id, trx);
				if (!user) throw new NotFoundError('User');
				if (user.role === 'admin' && role !== 'admin' && (await users.countAdmins(trx)) <= 1) {
					throw new ConflictError('The last administrator cannot lose the admin role', {
						role: ['The last administrator cannot lose the admin role']
					});
				}
				await users.setRole(id, role, trx);
				return (await users.findById(id, trx))!;
			});
		}
	};
}
