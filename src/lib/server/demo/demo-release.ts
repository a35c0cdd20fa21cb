/**
 * The demo's released item (issue 6, "done means"): once the demo run has succeeded, the demo
 * technician submits it, the demo supervisor approves it and the demo admin releases it, through
 * the same services as the screens, so the demo client has a report to download. Call it after
 * the demo run succeeds; it does nothing when the run has not, or when the item is already released.
 */
import type { Knex } from 'knex';
import type { SessionUser } from '../../roles';
import { systemClock } from '../clock';
import type { Mailer } from '../mail';
import { reportRepository } from '../repositories/report.repository';
import { runRepository } from '../repositories/run.repository';
import { userRepository } from '../repositories/user.repository';
import { releaseService } from '../services/release.service';
import { reviewService } from '../services/review.service';
import { storage } from '../storage';
import { DEMO_USERS } from './scenario';

// Seeding is not an event anyone needs to hear about: the demo sends no e-mail.
const silent: Mailer = { send: async () => {} };

async function demoUser(knex: Knex, role: SessionUser['role']): Promise<SessionUser> {
	const email = DEMO_USERS.find((u) => u.role === role)!.email;
	const row = (await userRepository(knex).list()).find((u) => u.email === email);
	if (!row) throw new Error(`demo ${role} ${email} is missing: seed the demo users first`);
	return { id: row.id, name: row.name, email: row.email, role: row.role };
}

export async function releaseDemoItem(knex: Knex, runId: number): Promise<{ reportId: string } | null> {
	const run = await runRepository(knex).findById(runId);
	if (!run || run.status !== 'succeeded' || (await reportRepository(knex).latestForItem(run.itemId))) return null;
	const [technician, supervisor, admin] = await Promise.all((['technician', 'supervisor', 'admin'] as const).map((r) => demoUser(knex, r)));
	const reviews = reviewService(knex, { clock: systemClock, mailer: silent });
	const proposal = await reviews.submit(
		technician,
		run.id,
		'Straight-motion kernel measured along the light streak over the bay sign; RL-TV to hold back ringing at the sign edges.'
	);
	await reviews.approve(supervisor, proposal.id, 'Kernel agrees with the streak; no ringing at the sign edges that would mislead.');
	const report = await releaseService(knex, { clock: systemClock, storage: storage(), mailer: silent }).release(admin, proposal.id);
	return { reportId: report.reportId };
}
