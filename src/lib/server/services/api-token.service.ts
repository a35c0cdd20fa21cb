/**
 * Personal API tokens for automation (`Authorization: Bearer <token>`). The secret is shown once
 * at creation; only its SHA-256 is kept, so a database leak does not leak usable tokens.
 */
import { createHash, randomBytes } from 'node:crypto';
import type { Knex } from 'knex';
import type { SessionUser } from '../../roles';
import { NotFoundError } from '../errors';
import { apiTokenRepository, type ApiTokenRow } from '../repositories/api-token.repository';
import { userService } from './user.service';

const TOKEN_PREFIX = 'spt_';

const digest = (secret: string) => createHash('sha256').update(secret, 'utf8').digest('hex');

export function apiTokenService(knex: Knex) {
	const tokens = apiTokenRepository(knex);

	return {
		/** Create a token and return its secret; the secret cannot be shown again. */
		async create(user: SessionUser, name: string): Promise<{ token: ApiTokenRow; secret: string }> {
			const secret = TOKEN_PREFIX + randomBytes(32).toString('base64url');
			const id = await tokens.insert({
				userId: user.id,
				name,
				tokenHash: digest(secret),
				tokenPrefix: secret.slice(0, 10)
			});
			const token = (await tokens.listForUser(user.id)).find((t) => t.id === id)!;
			return { token, secret };
		},

		list: (user: SessionUser) => tokens.listForUser(user.id),

		async revoke(user: SessionUser, id: number): Promise<void> {
			if (!(await tokens.revoke(id, user.id))) throw new NotFoundError('Token');
		},

		/** The active user behind a bearer secret, or null for an unknown, revoked or malformed one. */
		async authenticate(secret: string): Promise<SessionUser | null> {
			if (!secret.startsWith(TOKEN_PREFIX) || secret.length > 100) return null;
			const owner = await tokens.activeOwner(digest(secret));
			if (!owner) return null;
			await tokens.touch(owner.id);
			return userService(knex).sessionUser(owner.userId);
		}
	};
}
