/** All SQL touching `api_tokens`. Only SHA-256 digests of token secrets are stored. */
import type { Knex } from 'knex';

export interface ApiTokenRow {
	id: number;
	userId: number;
	name: string;
	tokenPrefix: string;
	createdAt: Date;
	lastUsedAt: Date | null;
	revokedAt: Date | null;
}

const columns = [
	'id',
	'user_id as userId',
	'name',
	'token_prefix as tokenPrefix',
	'created_at as createdAt',
	'last_used_at as lastUsedAt',
	'revoked_at as revokedAt'
];

export function apiTokenRepository(knex: Knex) {
	return {
		async insert(row: { userId: number; name: string; tokenHash: string; tokenPrefix: string }, trx: Knex = knex): Promise<number> {
			const [id] = await trx('api_tokens').insert({
				user_id: row.userId,
				name: row.name,
				token_hash: row.tokenHash,
				token_prefix: row.tokenPrefix
			});
			return id;
		},

		listForUser(userId: number, trx: Knex = knex): Promise<ApiTokenRow[]> {
			return trx('api_tokens').select(columns).where({ user_id: userId }).orderBy('id', 'desc');
		},

		/** The owner of a live (not revoked) token with this digest. */
		async activeOwner(tokenHash: string, trx: Knex = knex): Promise<{ id: number; userId: number } | undefined> {
			return trx('api_tokens')
				.select('id', 'user_id as userId')
				.where({ token_hash: tokenHash })
				.whereNull('revoked_at')
				.first();
		},

		async touch(id: number, trx: Knex = knex): Promise<void> {
			await trx('api_tokens').where({ id }).update({ last_used_at: trx.fn.now(3) });
		},

		async revoke(id: number, userId: number, trx: Knex = knex): Promise<boolean> {
			const changed = await trx('api_tokens')
				.where({ id, user_id: userId })
				.whereNull('revoked_at')
				.update({ revoked_at: trx.fn.now(3) });
			return changed > 0;
		}
	};
}
