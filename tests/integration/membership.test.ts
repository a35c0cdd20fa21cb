/**
 * The case-membership rule (issue 2 §3: "a client sees only cases they are a member of"),
 * checked through the JSON API that the pages' tables fetch from: a client never lists nor
 * reads a case they are not a member of, whatever the filters; staff see every case.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { Role, SessionUser } from '../../src/lib/roles';
import { caseService } from '../../src/lib/server/services/case.service';
import { userService } from '../../src/lib/server/services/user.service';
import { signIn, signInAs } from './support/auth';
import { closeTestDb, testDb } from './support/db';
import { readJson, type ApiError, type HttpClient } from './support/http';

interface CaseBody {
	id: number;
	reference: string;
	title: string;
}

const NEW_CASE = {
	title: 'Membership check — smeared licence plate, bay 14',
	reference: 'IT-MEMBER-0001',
	kind: 'forensic',
	description: 'Created by the integration suite; the demo client is not a member at first.'
};

let client: HttpClient;
let staff: Record<Exclude<Role, 'client'>, HttpClient>;
let clientUser: SessionUser;
let newCaseId: number;

async function listIds(session: HttpClient, query = ''): Promise<number[]> {
	const body = await session.getJson<{ cases: CaseBody[] }>(`/api/cases${query}`);
	return body.cases.map((c) => c.id);
}

async function memberCaseIds(userId: number): Promise<number[]> {
	const rows = await testDb()('case_members').where({ user_id: userId }).select('case_id');
	return rows.map((r) => Number(r.case_id)).sort((a, b) => a - b);
}

async function allCaseIds(): Promise<number[]> {
	return (await testDb()('cases').select('id')).map((r) => Number(r.id)).sort((a, b) => a - b);
}

const sorted = (ids: number[]) => [...ids].sort((a, b) => a - b);

beforeAll(async () => {
	[client, staff] = await Promise.all([
		signIn('client'),
		Promise.all([signIn('admin'), signIn('technician'), signIn('supervisor')]).then(([admin, technician, supervisor]) => ({
			admin,
			technician,
			supervisor
		}))
	]);
	clientUser = (await client.getJson<{ user: SessionUser }>('/api/me')).user;

	const created = await staff.technician.post('/api/cases', { json: NEW_CASE });
	expect(created.status).toBe(201);
	newCaseId = (await readJson<{ case: CaseBody }>(created)).case.id;
});

afterAll(closeTestDb);

describe('a client who is not a member', () => {
	test('lists exactly the cases they are a member of — none of the others', async () => {
		const members = await memberCaseIds(clientUser.id);
		expect(members.length).toBeGreaterThan(0); // the demo scenario makes the client a member of some
		expect((await allCaseIds()).length).toBeGreaterThan(members.length); // …and not of others
		expect(sorted(await listIds(client, '?limit=200'))).toEqual(members);
		expect(members).not.toContain(newCaseId);
	});

	// Each query is chosen so that it matches at least one case the client is not a member of
	// (checked against a staff account), so an empty client answer proves the rule, not the filter.
	test.each([
		['search by the exact reference', `?q=${NEW_CASE.reference}`],
		['search by a title fragment', '?q=licence%20plate'],
		['search matching every demo case prefix', '?q=-20'],
		['kind filter', '?kind=forensic'],
		['status filter', '?status=open'],
		['kind and status together', '?kind=archival&status=open'],
		['in review (the demo case without members)', '?status=in_review'],
		['"mine" (created by or member of)', '?mine=1'],
		['sorted by title, ascending, high limit', '?sort=title&dir=asc&limit=200'],
		['sorted by reference, descending', '?sort=reference&dir=desc']
	])('never lists a non-member case: %s (%s)', async (_label, query) => {
		const members = new Set(await memberCaseIds(clientUser.id));
		const staffIds = await listIds(staff.technician, query);
		const clientIds = await listIds(client, query);

		if (query !== '?mine=1') expect(staffIds.some((id) => !members.has(id)), 'query must match a non-member case').toBe(true);
		expect(clientIds.filter((id) => !members.has(id))).toEqual([]);
		// Filters still work for the client inside their own cases.
		expect(clientIds.every((id) => query === '?mine=1' || staffIds.includes(id))).toBe(true);
	});

	test('reading a non-member case answers 404, exactly as a case that does not exist', async () => {
		const hidden = await client.get(`/api/cases/${newCaseId}`);
		const missing = await client.get('/api/cases/999999');
		// Not 403: a 403 would confirm the case exists (RFC 9110 §15.5.5 allows 404 to hide it).
		expect(hidden.status).toBe(404);
		expect(missing.status).toBe(404);
		expect(await readJson<ApiError>(hidden)).toEqual(await readJson<ApiError>(missing));
	});

	test('a client who is a member of nothing lists nothing', async () => {
		const email = 'lonely-client@stillpoint.test';
		await userService(testDb()).create({ name: 'Lonely Client', email, role: 'client', password: 'integration-pass-1234' });
		const lonely = await signInAs(email, 'integration-pass-1234');
		expect(await listIds(lonely, '?limit=200')).toEqual([]);
		expect(await listIds(lonely, '?q=QCEU')).toEqual([]);
		expect((await lonely.get(`/api/cases/${newCaseId}`)).status).toBe(404);
	});
});

describe('adding the client as a member', () => {
	beforeAll(async () => {
		const technician = (await staff.technician.getJson<{ user: SessionUser }>('/api/me')).user;
		await caseService(testDb()).addMember(technician, newCaseId, clientUser.id);
	});

	test('makes the case listed and readable for that client, and for no other client', async () => {
		expect(await listIds(client, `?q=${NEW_CASE.reference}`)).toEqual([newCaseId]);
		expect(await listIds(client, '?limit=200')).toContain(newCaseId);

		const response = await client.get(`/api/cases/${newCaseId}`);
		expect(response.status).toBe(200);
		const detail = await readJson<{ case: CaseBody; members: { userId: number }[] }>(response);
		expect(detail.case.reference).toBe(NEW_CASE.reference);
		expect(detail.members.map((m) => m.userId)).toContain(clientUser.id);

		const lonely = await signInAs('lonely-client@stillpoint.test', 'integration-pass-1234');
		expect((await lonely.get(`/api/cases/${newCaseId}`)).status).toBe(404);
	});
});

describe('staff (issue 2: lab staff work on every case)', () => {
	test.each(['admin', 'technician', 'supervisor'] as const)('%s lists every case and reads any of them', async (role) => {
		const all = await allCaseIds();
		expect(sorted(await listIds(staff[role], '?limit=200'))).toEqual(all);
		for (const id of all) expect((await staff[role].get(`/api/cases/${id}`)).status, `case ${id}`).toBe(200);
	});
});
