/**
 * Bad input to the JSON API (issue 2, "Tests this issue must add": malformed JSON and wrong types
 * get 400 with a field-level message). Each refusal carries `{error, fields}` with the offending
 * field named (the body as a whole is the field ''), and nothing is written.
 * Statuses: RFC 9110 §15.5.1 400 Bad Request; §15.5.16 415 Unsupported Media Type for a body that
 * is not JSON at all; §15.5.10 409 Conflict for a duplicate.
 */
import { afterAll, beforeAll, beforeEach, afterEach, describe, expect, test } from 'vitest';
import { signIn } from './support/auth';
import { closeTestDb, countRows, testDb } from './support/db';
import { readJson, type ApiError, type HttpClient, type RequestOptions } from './support/http';

const VALID_CASE = { title: 'Bad-input baseline case', reference: 'IT-BAD-0001', kind: 'forensic' };
const VALID_USER = { name: 'Bad Input', email: 'bad-input@stillpoint.test', role: 'client', password: 'bad-input-pass-1234' };

let admin: HttpClient;
let technician: HttpClient;
let targetId: number;
let counts: { users: number; cases: number; case_members: number; roles: string };

async function snapshot() {
	const roles = (await testDb()('users').select('id', 'role').orderBy('id')).map((r) => `${r.id}:${r.role}`).join(',');
	return { users: await countRows('users'), cases: await countRows('cases'), case_members: await countRows('case_members'), roles };
}

/** Send, expect the status and a field-level message for `field`; return the body for more checks. */
async function refused(session: HttpClient, method: string, path: string, options: RequestOptions, status: number, field?: string) {
	const response = await session.request(method, path, options);
	const body = await readJson<ApiError>(response);
	expect(response.status, JSON.stringify(body)).toBe(status);
	expect(typeof body.error).toBe('string');
	expect(body.error.length).toBeGreaterThan(0);
	if (field !== undefined) {
		expect(body.fields, JSON.stringify(body)).toBeDefined();
		expect(Object.keys(body.fields!)).toContain(field);
		expect(body.fields![field].every((m) => typeof m === 'string' && m.length > 0)).toBe(true);
	}
	return body;
}

beforeAll(async () => {
	[admin, technician] = await Promise.all([signIn('admin'), signIn('technician')]);
	[targetId] = await testDb()('users').insert({
		name: 'Bad Input Target',
		email: 'bad-input-target@stillpoint.test',
		role: 'client',
		password_hash: '$2b$12$notarealhashnotarealhashnotarealhashnotarealhashnotr'
	});
});

beforeEach(async () => {
	counts = await snapshot();
});

// Whatever a test sent, the database is as it was.
afterEach(async () => {
	expect(await snapshot()).toEqual(counts);
});

afterAll(closeTestDb);

describe('the valid baselines are accepted (so the refusals below are about the input)', () => {
	test('GET /api/cases with every parameter at a valid value answers 200', async () => {
		const response = await technician.get('/api/cases?q=QCEU&status=open&kind=forensic&mine=1&sort=title&dir=asc&limit=5');
		expect(response.status).toBe(200);
	});
});

describe('POST /api/cases', () => {
	const send = (options: RequestOptions, status: number, field?: string) => refused(technician, 'POST', '/api/cases', options, status, field);

	test('malformed JSON → 400 naming the whole body', () => send({ body: '{"title": "Half', contentType: 'application/json' }, 400, ''));
	test('a JSON array instead of an object → 400 naming the whole body', () => send({ json: [VALID_CASE] }, 400, ''));
	test('JSON null → 400 naming the whole body', () => send({ body: 'null', contentType: 'application/json' }, 400, ''));
	test('title of the wrong type (number) → 400 naming title', () => send({ json: { ...VALID_CASE, title: 42 } }, 400, 'title'));
	test('title too short → 400 naming title', () => send({ json: { ...VALID_CASE, title: 'ab' } }, 400, 'title'));
	test('reference with spaces → 400 naming reference', () => send({ json: { ...VALID_CASE, reference: 'has spaces' } }, 400, 'reference'));
	test('unknown kind → 400 naming kind', () => send({ json: { ...VALID_CASE, kind: 'digital' } }, 400, 'kind'));
	test('kind of the wrong type (array) → 400 naming kind', () => send({ json: { ...VALID_CASE, kind: ['forensic'] } }, 400, 'kind'));
	test('description of the wrong type (object) → 400 naming description', () =>
		send({ json: { ...VALID_CASE, description: { text: 'x' } } }, 400, 'description'));

	test('missing fields → 400 naming each of them', async () => {
		const body = await send({ json: {} }, 400, 'title');
		expect(Object.keys(body.fields!)).toEqual(expect.arrayContaining(['title', 'reference', 'kind']));
	});

	test('a form body (wrong Content-Type) → 415', () =>
		send({ form: { title: VALID_CASE.title, reference: VALID_CASE.reference, kind: VALID_CASE.kind } }, 415));
	test('text/plain carrying JSON → 415', () => send({ body: JSON.stringify(VALID_CASE), contentType: 'text/plain' }, 415));

	test('a duplicate reference (any case) → 409 naming reference', async () => {
		const [id] = await testDb()('cases').insert({ ...VALID_CASE, created_by: targetId });
		counts = await snapshot();
		try {
			await send({ json: { ...VALID_CASE, reference: VALID_CASE.reference.toLowerCase() } }, 409, 'reference');
		} finally {
			await testDb()('cases').where({ id }).delete();
			counts = await snapshot();
		}
	});
});

describe('POST /api/users', () => {
	const send = (options: RequestOptions, status: number, field?: string) => refused(admin, 'POST', '/api/users', options, status, field);

	test('malformed JSON → 400 naming the whole body', () => send({ body: '{name:', contentType: 'application/json' }, 400, ''));
	test('e-mail that is not one → 400 naming email', () => send({ json: { ...VALID_USER, email: 'not-an-address' } }, 400, 'email'));
	test('e-mail of the wrong type → 400 naming email', () => send({ json: { ...VALID_USER, email: 12345 } }, 400, 'email'));
	test('unknown role → 400 naming role', () => send({ json: { ...VALID_USER, role: 'superuser' } }, 400, 'role'));
	test('role in the wrong case → 400 naming role', () => send({ json: { ...VALID_USER, role: 'ADMIN' } }, 400, 'role'));
	test('password shorter than 12 → 400 naming password', () => send({ json: { ...VALID_USER, password: 'short' } }, 400, 'password'));
	test('name of the wrong type → 400 naming name', () => send({ json: { ...VALID_USER, name: true } }, 400, 'name'));

	test('missing fields → 400 naming each of them', async () => {
		const body = await send({ json: {} }, 400, 'email');
		expect(Object.keys(body.fields!)).toEqual(expect.arrayContaining(['name', 'email', 'role', 'password']));
	});

	test('a form body (wrong Content-Type) → 415', () => send({ form: VALID_USER }, 415));

	test('the password never comes back in an error', async () => {
		const body = await send({ json: { ...VALID_USER, role: 'superuser' } }, 400, 'role');
		expect(JSON.stringify(body)).not.toContain(VALID_USER.password);
	});
});

describe('PATCH /api/users/{id}', () => {
	const send = (options: RequestOptions, status: number, field?: string) =>
		refused(admin, 'PATCH', `/api/users/${targetId}`, options, status, field);

	test('malformed JSON → 400 naming the whole body', () => send({ body: '{"role": ', contentType: 'application/json' }, 400, ''));
	test('unknown role → 400 naming role', () => send({ json: { role: 'owner' } }, 400, 'role'));
	test('role of the wrong type → 400 naming role', () => send({ json: { role: 3 } }, 400, 'role'));
	test('missing role → 400 naming role', () => send({ json: {} }, 400, 'role'));
	test('a form body (wrong Content-Type) → 415', () => send({ form: { role: 'technician' } }, 415));
});

describe('GET /api/cases query parameters', () => {
	test.each([
		['status', '?status=archived'],
		['kind', '?kind=digital'],
		['sort', '?sort=password_hash'],
		['dir', '?dir=sideways'],
		['limit', '?limit=0'],
		['limit', '?limit=201'],
		['limit', '?limit=ten'],
		['limit', '?limit=2.5'],
		['mine', '?mine=yes'],
		['q', `?q=${'x'.repeat(101)}`]
	])('bad %s (%s) → 400 naming it', async (field, query) => {
		await refused(technician, 'GET', `/api/cases${query}`, {}, 400, field);
	});

	test('a bad role filter on GET /api/users → 400 naming role', async () => {
		await refused(admin, 'GET', '/api/users?role=root', {}, 400, 'role');
	});
});
