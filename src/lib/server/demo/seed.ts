/** Load the invented demo scenario. Idempotent: existing users and cases are left as they are. */
import type { Knex } from 'knex';
import { hashPassword } from '../passwords';
import { caseRepository } from '../repositories/case.repository';
import { userRepository } from '../repositories/user.repository';
import { DEMO_CASES, DEMO_USERS } from './scenario';

export async function seedDemo(knex: Knex): Promise<{ usersAdded: number; casesAdded: number }> {
	const users = userRepository(knex);
	const cases = caseRepository(knex);
	const idByEmail = new Map<string, number>();
	let usersAdded = 0;
	let casesAdded = 0;

	for (const user of DEMO_USERS) {
		const existing = await users.findByEmailWithHash(user.email);
		if (existing) {
			idByEmail.set(user.email, existing.id);
			continue;
		}
		const id = await users.insert({ ...user, passwordHash: await hashPassword(user.password) });
		idByEmail.set(user.email, id);
		usersAdded++;
	}

	for (const demo of DEMO_CASES) {
		if (await cases.findByReference(demo.reference)) continue;
		await knex.transaction(async (trx) => {
			const createdBy = idByEmail.get(demo.createdBy)!;
			const caseId = await cases.insert({ ...demo, createdBy }, trx);
			for (const email of demo.members) await cases.addMember(caseId, idByEmail.get(email)!, createdBy, trx);
		});
		casesAdded++;
	}
	return { usersAdded, casesAdded };
}
