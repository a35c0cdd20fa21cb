/**
 * Load the invented demo scenario through the same services the app uses, so its custody
 * ledger is as real as any other. Idempotent: existing users and cases are left as they are.
 */
import type { Knex } from 'knex';
import type { SessionUser } from '../../roles';
import { hashPassword } from '../passwords';
import { caseRepository } from '../repositories/case.repository';
import { userRepository } from '../repositories/user.repository';
import { caseService } from '../services/case.service';
import { seedDemoRestoration } from './demo-restoration';
import { DEMO_CASES, DEMO_USERS } from './scenario';

export interface SeedReport {
	usersAdded: number;
	casesAdded: number;
	/** The demo photo and its queued run, when this seed added them. */
	restoration: { itemId: number; runId: number } | null;
}

export async function seedDemo(knex: Knex, options: { withPhoto?: boolean } = {}): Promise<SeedReport> {
	const users = userRepository(knex);
	const cases = caseRepository(knex);
	const service = caseService(knex);
	const byEmail = new Map<string, SessionUser>();
	let usersAdded = 0;
	let casesAdded = 0;

	for (const demo of DEMO_USERS) {
		let id = (await users.findByEmailWithHash(demo.email))?.id;
		if (id === undefined) {
			id = await users.insert({ ...demo, passwordHash: await hashPassword(demo.password) });
			usersAdded++;
		}
		byEmail.set(demo.email, { id, name: demo.name, email: demo.email, role: demo.role });
	}

	for (const demo of DEMO_CASES) {
		if (await cases.findByReference(demo.reference)) continue;
		const creator = byEmail.get(demo.createdBy)!;
		const created = await service.create(creator, demo);
		for (const email of demo.members) await service.addMember(creator, created.id, byEmail.get(email)!.id);
		if (demo.status !== 'open') await cases.setStatus(created.id, demo.status);
		casesAdded++;
	}
	const restoration = options.withPhoto ? await seedDemoRestoration(knex, byEmail.get('tech@stillpoint.example')!) : null;
	return { usersAdded, casesAdded, restoration };
}
