/**
 * Accounts and sign-in against the real server, MariaDB and Redis (issue 2 §4): a user of each
 * role signs in and the session carries the role; refusals give one generic message; repeated
 * failures lock the account for a while; the last administrator cannot be demoted.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { Role } from '../../src/lib/roles';
import { userService } from '../../src/lib/server/services/user.service';
import { alertText, attemptSignIn, signIn, signInAs } from './support/auth';
import { signInMaxFailures } from './support/context';
import { closeTestDb, testDb } from './support/db';
import { readJson, type ApiError, type HttpClient } from './support/http';
import { clearSignInFailures } from './support/redis';

// Issue 2 §4: "Roles: admin, technician, supervisor, client".
const ROLES: Role[] = ['admin', 'technician', 'supervisor', 'client'];
const PASSWORD = 'integration-pass-1234';

interface MeBody {
	user: { id: number; email: string; role: Role } | null;
}

async function roleOverHttp(client: HttpClient): Promise<Role | undefined> {
	const response = await client.get('/api/me');
	expect(response.status).toBe(200);
	return (await readJson<MeBody>(response)).user?.role;
}

let admin: HttpClient;

beforeAll(async () => {
	admin = await signIn('admin');
});

afterAll(async () => {
	await clearSignInFailures();
	await closeTestDb();
});

describe('a user of each role, created and then signed in over HTTP', () => {
	test.each(ROLES)('%s created through the user service signs in and GET /api/me reports the role', async (role) => {
		const email = `svc-${role}@stillpoint.test`;
		const created = await userService(testDb()).create({ name: `Service ${role}`, email, role, password: PASSWORD });
		expect(created.role).toBe(role);

		const stored = await testDb()('users').where({ email }).first();
		// Stored as a bcrypt hash (Provos & Mazières 1999; "$2a$/$2b$" prefix), never as the password.
		expect(stored.password_hash).toMatch(/^\$2[aby]\$12\$/);
		expect(stored.password_hash).not.toContain(PASSWORD);

		const session = await signInAs(email, PASSWORD);
		expect(await roleOverHttp(session)).toBe(role);
	});

	test.each(ROLES)('%s created by an admin with POST /api/users signs in with that role', async (role) => {
		const email = `api-${role}@stillpoint.test`;
		const response = await admin.post('/api/users', { json: { name: `API ${role}`, email, role, password: PASSWORD } });
		expect(response.status).toBe(201);
		const body = await readJson<{ user: Record<string, unknown> }>(response);
		expect(body.user).toMatchObject({ email, role, active: true });
		expect(Object.keys(body.user)).not.toContain('passwordHash');

		const session = await signInAs(email, PASSWORD);
		expect(await roleOverHttp(session)).toBe(role);
	});

	test('a second account with the same e-mail (any case) is refused with 409 naming the field', async () => {
		const response = await admin.post('/api/users', {
			json: { name: 'Duplicate', email: 'API-CLIENT@stillpoint.test', role: 'client', password: PASSWORD }
		});
		expect(response.status).toBe(409);
		expect((await readJson<ApiError>(response)).fields).toHaveProperty('email');
		expect(await testDb()('users').whereRaw('LOWER(email) = ?', ['api-client@stillpoint.test']).count({ n: '*' })).toEqual([{ n: 1 }]);
	});
});

describe('refused sign-ins (issue 2 §4: "one generic message")', () => {
	const email = 'refused@stillpoint.test';

	beforeAll(async () => {
		await userService(testDb()).create({ name: 'Refused Person', email, role: 'technician', password: PASSWORD });
	});

	test('a wrong password and an unknown e-mail both answer 401 with the same message and no session', async () => {
		const wrongPassword = await attemptSignIn(email, `${PASSWORD}-wrong`);
		const unknownEmail = await attemptSignIn('nobody-here@stillpoint.test', PASSWORD);

		for (const attempt of [wrongPassword, unknownEmail]) {
			// RFC 9110 §15.5.2 401 Unauthorized: the request lacks valid credentials.
			expect(attempt.status).toBe(401);
			expect(attempt.client.cookieHeader()).not.toMatch(/session-token/);
			expect(await attempt.client.get('/api/me').then((r) => r.status)).toBe(401);
		}
		const message = alertText(wrongPassword.html);
		expect(message).toBeTruthy();
		expect(alertText(unknownEmail.html)).toBe(message);
		// The message must not say which of the two was wrong.
		expect(message).not.toMatch(/unknown|no (such )?(user|account)|incorrect password|wrong password/i);
	});

	test('fields that are not even valid answer 400, not 401', async () => {
		const attempt = await attemptSignIn('not-an-e-mail', '');
		expect(attempt.status).toBe(400);
	});
});

describe('sign-in failure limit (issue 2 §4: "sign-in failures are rate-limited")', () => {
	// A dedicated account, so locking it blocks no other test.
	const email = 'rate-limited@stillpoint.test';
	let genericMessage: string | null;

	beforeAll(async () => {
		await userService(testDb()).create({ name: 'Rate Limited', email, role: 'client', password: PASSWORD });
		genericMessage = alertText((await attemptSignIn('nobody-here@stillpoint.test', 'whatever-it-is')).html);
	});

	test('one failure short of the limit, the right password still signs in (and clears the count)', async () => {
		for (let i = 1; i < signInMaxFailures(); i++) {
			expect((await attemptSignIn(email, `wrong-${i}`)).status).toBe(401);
		}
		const session = await signInAs(email, PASSWORD);
		expect(await roleOverHttp(session)).toBe('client');
	});

	test(`after the limit of failures, the right password is refused with the same 401 and message`, async () => {
		for (let i = 1; i <= signInMaxFailures(); i++) {
			const attempt = await attemptSignIn(email, `wrong-${i}`);
			expect(attempt.status, `failure ${i}`).toBe(401);
		}
		const locked = await attemptSignIn(email, PASSWORD);
		expect(locked.status).toBe(401);
		expect(alertText(locked.html)).toBe(genericMessage);
		expect(locked.client.cookieHeader()).not.toMatch(/session-token/);
	});

	test('the lock is per account: another user signs in meanwhile', async () => {
		const other = await signInAs('svc-supervisor@stillpoint.test', PASSWORD);
		expect(await roleOverHttp(other)).toBe('supervisor');
	});
});

describe('role changes (issue 2 §4: "admin can … set roles")', () => {
	test('a demoted account loses the role at once, on its existing session', async () => {
		const session = await signInAs('api-admin@stillpoint.test', PASSWORD);
		expect(await roleOverHttp(session)).toBe('admin');
		const id = (await testDb()('users').where({ email: 'api-admin@stillpoint.test' }).first()).id;

		const response = await admin.patch(`/api/users/${id}`, { json: { role: 'technician' } });
		expect(response.status).toBe(200);
		expect(await roleOverHttp(session)).toBe('technician');
		expect((await session.post('/api/users', { json: { name: 'Nope', email: 'nope@stillpoint.test', role: 'admin', password: PASSWORD } })).status).toBe(403);
	});

	test('the last administrator cannot be demoted: 409 naming the role, nothing changes', async () => {
		const me = (await readJson<MeBody>(await admin.get('/api/me'))).user!;
		const otherAdmins = await testDb()('users').where({ role: 'admin', active: true }).whereNot({ id: me.id }).select('id');
		for (const { id } of otherAdmins) {
			expect((await admin.patch(`/api/users/${id}`, { json: { role: 'technician' } })).status).toBe(200);
		}
		expect(await testDb()('users').where({ role: 'admin', active: true }).count({ n: '*' })).toEqual([{ n: 1 }]);

		// RFC 9110 §15.5.10 409 Conflict: the request conflicts with the resource's current state.
		const response = await admin.patch(`/api/users/${me.id}`, { json: { role: 'supervisor' } });
		expect(response.status).toBe(409);
		expect((await readJson<ApiError>(response)).fields).toHaveProperty('role');
		expect((await testDb()('users').where({ id: me.id }).first()).role).toBe('admin');
		expect(await roleOverHttp(admin)).toBe('admin');
	});

	test('an unknown user id answers 404', async () => {
		const response = await admin.patch('/api/users/999999', { json: { role: 'client' } });
		expect(response.status).toBe(404);
	});
});
