/** All SQL touching `users`. */
import type { Knex } from 'knex';
import type { Role } from '../../roles';

export interface UserRow {
	id: number;
	name: string;
	email: string;
	role: Role;
	active: boolean;
	createdAt: Date;
}

interface UserWithHash extends UserRow {
	passwordHash: string;
}

const columns = ['id', 'name', 'email', 'role', 'active', 'created_at as createdAt'];

function fromDb(row: Record<string, unknown>): UserRow {
	return { ...(row as unknown as UserRow), active: Boolean(row.active) };
}

export function userRepository(knex: Knex) {
	return {
		async findById(id: number, trx: Knex = knex): Promise<UserRow | undefined> {
			const row = await trx('users').select(columns).where({ id }).first();
			return row ? fromDb(row) : undefined;
		},

		async findByEmailWithHash(email: string, trx: Knex = knex): Promise<UserWithHash | undefined> {
			const row = await trx('users')
				.select([...columns, 'password_hash as passwordHash'])
				.where({ email })
				.first();
			return row ? (fromDb(row) as UserWithHash) : undefined;
		},

		async list(trx: Knex = knex): Promise<UserRow[]> {
			const rows = await trx('users').select(columns).orderBy([{ column: 'role' }, { column: 'name' }]);
			return rows.map(fromDb);
		},

		async listByRole(role: Role, trx: Knex = knex): Promise<UserRow[]> {
			const rows = await trx('users').select(columns).where({ role, active: true }).orderBy('name');
			return rows.map(fromDb);
		},

		async insert(
			user: { name: string; email: string; role: Role; passwordHash: string },
			trx: Knex = knex
		): Promise<number> {
			const [id] = await trx('users').insert({
				name: user.name,
				email: user.email,
				role: user.role,
				password_hash: user.passwordHash
			});
			return id;
		},

		async setRole(id: number, role: Role, trx: Knex = knex): Promise<number> {
			return trx('users').where({ id }).update({ role, updated_at: trx.fn.now(3) });
		},

		async countAdmins(trx: Knex = knex): Promise<number> {
			const row = await trx('users').where({ role: 'admin', active: true }).count({ n: '*' }).first();
			return Number(row?.n ?? 0);
		}
	};
}
