/**
 * The access matrix: for every route (pages and API) × method × caller, the status the issue's
 * rules call for, written out by hand in ONE table — not derived from ROUTE_ACCESS, so it checks it.
 *
 * Sources for the expectations:
 * - issue 2 §4: "a forbidden page answers 403, an anonymous one redirects to sign-in";
 *   "Admin can create users and set roles"; roles admin, technician, supervisor, client.
 * - issue 2 §3: "a client sees only cases they are a member of" (a hidden case reads as 404).
 * - issue 2 §5: a role-aware home, a cases table and a case page for everyone; a "new case" form
 *   for the people who open cases (technicians, and admins who can do everything); JSON API routes
 *   "with the same role checks as pages".
 * - RFC 9110 §15.5.2 (401: no valid credentials — an API caller without a session),
 *   §15.5.4 (403: understood but refused), §15.5.5 (404), §15.4.4 (303 See Other after a POST
 *   or to send a browser to another page), §15.3.2 (201 Created).
 * A new route makes the completeness checks at the bottom fail until it has a row here and a
 * rule in ROUTE_ACCESS.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, sep } from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { Role } from '../../src/lib/roles';
import { ROUTE_ACCESS } from '../../src/lib/server/access';
import { demoUser, signIn, signInAs } from './support/auth';
import { closeTestDb, countRows, testDb } from './support/db';
import { HttpClient, readJson, type RequestOptions } from './support/http';
import sharp from 'sharp';

type Caller = 'anonymous' | Role;
const CALLERS: Caller[] = ['anonymous', 'admin', 'technician', 'supervisor', 'client'];

/**
 * What one caller should get. A number is the exact status; the 303s also name where they lead:
 * `signin` → the sign-in page with the way back, `home` → '/', `case` → the new case's page,
 * `away` → anywhere (the sign-out redirect).
 */
type Expected = 200 | 201 | 202 | 400 | 401 | 403 | 404 | 409 | 422 | 'signin' | 'home' | 'case' | 'away';
/** In the order of CALLERS: anonymous, admin, technician, supervisor, client. */
type Row5 = [Expected, Expected, Expected, Expected, Expected];

interface Fixtures {
	/** A demo case the demo client is a member of. */
	memberCase: number;
	/** A demo case the demo client is not a member of. */
	hiddenCase: number;
	/** A user whose role and memberships the matrix changes and resets. */
	target: number;
	/** An original uploaded into the hidden case. */
	hiddenItem: number;
	/** An API token that belongs to the demo admin. */
	adminToken: number;
	/** A queued run on the hidden item (no worker runs during the matrix, so it stays queued). */
	queuedRun: number;
}

interface Row {
	route: string;
	method: 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';
	path: (f: Fixtures) => string;
	expect: Row5;
	/** The request body for this caller (valid, so a refusal is about the role, not the input). */
	request?: (caller: Caller, f: Fixtures) => Promise<RequestOptions> | RequestOptions;
	/** After the request: assert the change happened exactly when the caller was allowed to make it. */
	effect?: (caller: Caller, allowed: boolean, f: Fixtures) => Promise<void>;
	/** Why a row differs from the plain rule, when it does. */
	note?: string;
	/** Send with a session of its own (signed in for this row), so the row may end it. */
	ownSession?: true;
}

const TOKEN = (caller: Caller) => caller.toUpperCase();
const PASSWORD = 'matrix-pass-123456';

async function casesWithReference(reference: string) {
	return Number((await testDb()('cases').where({ reference }).count({ n: '*' }).first())?.n);
}
/** A small PNG whose bytes differ per caller, so each allowed upload is a new item, not a duplicate. */
async function pngFor(caller: Caller, name = `matrix-${caller}.png`): Promise<FormData> {
	const shade = CALLERS.indexOf(caller) * 40;
	const bytes = await sharp({ create: { width: 16, height: 16, channels: 3, background: { r: shade, g: 90, b: 30 } } }).png().toBuffer();
	const form = new FormData();
	form.append('file', new Blob([new Uint8Array(bytes)], { type: 'image/png' }), name);
	return form;
}
async function itemsNamed(name: string) {
	return Number((await testDb()('items').where({ original_name: name }).count({ n: '*' }).first())?.n);
}
const RUN_BODY = { method: 'wiener', psf: { kind: 'line', length: 5, angleDeg: 0 }, params: {} };

const DEMO_EMAIL: Record<Role, string> = {
	admin: 'admin@stillpoint.example',
	technician: 'tech@stillpoint.example',
	supervisor: 'supervisor@stillpoint.example',
	client: 'client@stillpoint.example'
};
/** Runs this caller queued on the item through the workbench form (its angle, 31.25°, is used nowhere else). */
async function formRunsBy(caller: Caller, itemId: number) {
	if (caller === 'anonymous') return 0;
	const user = await testDb()('users').where({ email: DEMO_EMAIL[caller] }).first();
	const rows = await testDb()('runs').where({ item_id: itemId, requested_by: user.id }).select('psf');
	return rows.filter((row) => (typeof row.psf === 'string' ? row.psf : JSON.stringify(row.psf)).includes('31.25')).length;
}
async function usersWithEmail(email: string) {
	return Number((await testDb()('users').where({ email }).count({ n: '*' }).first())?.n);
}

// prettier-ignore
const TABLE: Row[] = [
	// ── pages ────────────────────────────────────────────  anonymous  admin  technician  supervisor  client
	{ route: '/', method: 'GET', path: () => '/',                    expect: ['signin', 200, 200, 200, 200] },
	{ route: '/signin', method: 'GET', path: () => '/signin',        expect: [200, 'home', 'home', 'home', 'home'],
		note: 'a signed-in user has nothing to do on the sign-in page and is sent home' },
	{ route: '/signin', method: 'POST', path: () => '/signin',       expect: [400, 'home', 'home', 'home', 'home'],
		request: () => ({ form: { providerId: 'credentials', email: '', password: '', redirectTo: '/' } }),
		note: 'empty fields: 400 for a visitor; a signed-in user is sent home first' },
	{ route: '/signout', method: 'POST', path: () => '/signout',     expect: ['away', 'away', 'away', 'away', 'away'],
		request: () => ({ form: {}, keepJar: true }), ownSession: true,
		note: 'the jar keeps the old cookie, as a copy taken before sign-out would; it must no longer work (see the row effect)' },
	{ route: '/cases', method: 'GET', path: () => '/cases',          expect: ['signin', 200, 200, 200, 200] },
	{ route: '/cases/new', method: 'GET', path: () => '/cases/new',  expect: ['signin', 200, 200, 403, 403] },
	{ route: '/cases/new', method: 'POST', path: () => '/cases/new', expect: ['signin', 'case', 'case', 403, 403],
		request: (c) => ({ form: { title: `Matrix page case ${c}`, reference: `IT-MXP-${TOKEN(c)}`, kind: 'forensic', description: '' } }),
		effect: async (c, allowed) => expect(await casesWithReference(`IT-MXP-${TOKEN(c)}`)).toBe(allowed ? 1 : 0) },
	{ route: '/cases/[id=id]', method: 'GET', path: (f) => `/cases/${f.memberCase}`, expect: ['signin', 200, 200, 200, 200] },
	{ route: '/cases/[id=id]', method: 'GET', path: (f) => `/cases/${f.hiddenCase}`, expect: ['signin', 200, 200, 200, 404],
		note: 'issue 2 §3: not a member → the case does not exist for the client' },
	{ route: '/cases/[id=id]', method: 'POST', path: (f) => `/cases/${f.hiddenCase}?/addMember`, expect: ['signin', 200, 200, 403, 403],
		request: async (_c, f) => {
			await testDb()('case_members').where({ case_id: f.hiddenCase, user_id: f.target }).delete();
			return { form: { userId: String(f.target) } };
		},
		effect: async (_c, allowed, f) =>
			expect(await testDb()('case_members').where({ case_id: f.hiddenCase, user_id: f.target }).count({ n: '*' })).toEqual([{ n: allowed ? 1 : 0 }]) },
	{ route: '/cases/[id=id]/items/[itemId=id]', method: 'GET', path: (f) => `/cases/${f.hiddenCase}/items/${f.hiddenItem}`, expect: ['signin', 200, 200, 200, 404],
		note: 'issue 5: the item workbench; an original in a case the client is not a member of does not exist for them' },
	{ route: '/cases/[id=id]/items/[itemId=id]', method: 'POST', path: (f) => `/cases/${f.hiddenCase}/items/${f.hiddenItem}?/queue`, expect: ['signin', 200, 200, 403, 403],
		request: () => ({ form: { kernelKind: 'line', length: '9', angleDeg: '31.25', radius: '3', sigma: '1.5', method: 'wiener', nsrAuto: 'true', nsr: '0.01', iterations: '30', tv: '0.002', linearLight: 'true' } }),
		effect: async (c, allowed, f) => expect(await formRunsBy(c, f.hiddenItem)).toBe(allowed ? 1 : 0),
		note: 'issue 4 §6: technicians and admins queue runs; the workbench form goes through the run service' },
	{ route: '/admin/users', method: 'GET', path: () => '/admin/users', expect: ['signin', 200, 403, 403, 403] },
	{ route: '/admin/users', method: 'POST', path: () => '/admin/users?/create', expect: ['signin', 200, 403, 403, 403],
		request: (c) => ({ form: { name: `Matrix page ${c}`, email: `matrix-page-${c}@stillpoint.test`, role: 'client', password: PASSWORD } }),
		effect: async (c, allowed) => expect(await usersWithEmail(`matrix-page-${c}@stillpoint.test`)).toBe(allowed ? 1 : 0) },

	// ── JSON API ─────────────────────────────────────────  anonymous  admin  technician  supervisor  client
	{ route: '/api/me', method: 'GET', path: () => '/api/me',        expect: [401, 200, 200, 200, 200] },
	{ route: '/api/cases', method: 'GET', path: () => '/api/cases',  expect: [401, 200, 200, 200, 200] },
	{ route: '/api/cases', method: 'POST', path: () => '/api/cases', expect: [401, 201, 201, 403, 403],
		request: (c) => ({ json: { title: `Matrix API case ${c}`, reference: `IT-MXA-${TOKEN(c)}`, kind: 'archival' } }),
		effect: async (c, allowed) => expect(await casesWithReference(`IT-MXA-${TOKEN(c)}`)).toBe(allowed ? 1 : 0) },
	{ route: '/api/cases/[id=id]', method: 'GET', path: (f) => `/api/cases/${f.memberCase}`, expect: [401, 200, 200, 200, 200] },
	{ route: '/api/cases/[id=id]', method: 'GET', path: (f) => `/api/cases/${f.hiddenCase}`, expect: [401, 200, 200, 200, 404],
		note: 'issue 2 §3: not a member → 404, never a 403 that would confirm the case exists' },
	{ route: '/api/cases/[id=id]', method: 'GET', path: () => '/api/cases/999999', expect: [401, 404, 404, 404, 404],
		note: 'the guard answers before the lookup: an anonymous caller learns nothing either' },
	{ route: '/api/users', method: 'GET', path: () => '/api/users', expect: [401, 200, 200, 200, 403],
		note: 'staff read the user list to pick case members; clients never see other accounts' },
	{ route: '/api/users', method: 'POST', path: () => '/api/users', expect: [401, 201, 403, 403, 403],
		request: (c) => ({ json: { name: `Matrix API ${c}`, email: `matrix-api-${c}@stillpoint.test`, role: 'client', password: PASSWORD } }),
		effect: async (c, allowed) => expect(await usersWithEmail(`matrix-api-${c}@stillpoint.test`)).toBe(allowed ? 1 : 0) },
	{ route: '/api/users/[id=id]', method: 'PATCH', path: (f) => `/api/users/${f.target}`, expect: [401, 200, 403, 403, 403],
		request: async (_c, f) => {
			await testDb()('users').where({ id: f.target }).update({ role: 'client' });
			return { json: { role: 'supervisor' } };
		},
		effect: async (_c, allowed, f) =>
			expect((await testDb()('users').where({ id: f.target }).first()).role).toBe(allowed ? 'supervisor' : 'client') },

	// ── originals (issue 4 §1, §6: technicians and admins upload; whoever sees the case reads) ──
	{ route: '/api/cases/[id=id]/items', method: 'GET', path: (f) => `/api/cases/${f.memberCase}/items`, expect: [401, 200, 200, 200, 200] },
	{ route: '/api/cases/[id=id]/items', method: 'GET', path: (f) => `/api/cases/${f.hiddenCase}/items`, expect: [401, 200, 200, 200, 404] },
	{ route: '/api/cases/[id=id]/items', method: 'POST', path: (f) => `/api/cases/${f.memberCase}/items`, expect: [401, 201, 201, 403, 403],
		request: async (c) => ({ multipart: await pngFor(c) }),
		effect: async (c, allowed) => expect(await itemsNamed(`matrix-${c}.png`)).toBe(allowed ? 1 : 0) },
	{ route: '/api/items/[id=id]', method: 'GET', path: (f) => `/api/items/${f.hiddenItem}`, expect: [401, 200, 200, 200, 404] },
	{ route: '/api/items/[id=id]/preview', method: 'GET', path: (f) => `/api/items/${f.hiddenItem}/preview`, expect: [401, 200, 200, 200, 404] },
	{ route: '/api/items/[id=id]/original', method: 'GET', path: (f) => `/api/items/${f.hiddenItem}/original`, expect: [401, 200, 200, 200, 404] },
	{ route: '/api/items/[id=id]/tiles', method: 'GET', path: (f) => `/api/items/${f.hiddenItem}/tiles`, expect: [401, 200, 200, 200, 404],
		note: 'issue 5: the zoom view reads what the preview shows, so the preview\'s audience' },
	{ route: '/api/items/[id=id]/tiles/[level]/[column]/[row]', method: 'GET', path: (f) => `/api/items/${f.hiddenItem}/tiles/0/0/0`, expect: [401, 200, 200, 200, 404] },
	{ route: '/api/items/[id=id]/region', method: 'GET', path: (f) => `/api/items/${f.hiddenItem}/region?x=0&y=0&width=4&height=4`, expect: [401, 200, 200, 200, 404] },

	// ── runs (issue 4 §6: technicians and admins create, cancel and replay; supervisors read;
	//    clients see nothing until a result is released to them) ──
	{ route: '/api/items/[id=id]/runs', method: 'GET', path: (f) => `/api/items/${f.hiddenItem}/runs`, expect: [401, 200, 200, 200, 403] },
	{ route: '/api/items/[id=id]/runs', method: 'POST', path: (f) => `/api/items/${f.hiddenItem}/runs`, expect: [401, 202, 202, 403, 403],
		request: () => ({ json: RUN_BODY }) },
	{ route: '/api/runs/[id=id]', method: 'GET', path: (f) => `/api/runs/${f.queuedRun}`, expect: [401, 200, 200, 200, 403] },
	{ route: '/api/runs/[id=id]/result', method: 'GET', path: (f) => `/api/runs/${f.queuedRun}/result`, expect: [401, 404, 404, 404, 403],
		note: 'a queued run has no result yet' },
	{ route: '/api/runs/[id=id]/preview', method: 'GET', path: (f) => `/api/runs/${f.queuedRun}/preview`, expect: [401, 404, 404, 404, 403],
		note: 'a queued run has no preview yet' },
	{ route: '/api/runs/[id=id]/replay', method: 'POST', path: (f) => `/api/runs/${f.queuedRun}/replay`, expect: [401, 409, 409, 403, 403],
		request: () => ({ json: {} }), note: 'only a succeeded run can be replayed' },
	{ route: '/api/runs/[id=id]/cancel', method: 'POST', path: (f) => `/api/runs/${f.queuedRun}/cancel`, expect: [401, 200, 200, 403, 403],
		request: async (_c, f) => {
			await testDb()('runs').where({ id: f.queuedRun }).update({ status: 'queued' });
			return { json: {} };
		},
		effect: async (_c, allowed, f) =>
			expect((await testDb()('runs').where({ id: f.queuedRun }).first()).status).toBe(allowed ? 'cancelled' : 'queued') },

	// ── blur estimation (issue 7 §6: staff ask for a proposed kernel) ──
	{ route: '/api/items/[id=id]/estimate', method: 'POST', path: (f) => `/api/items/${f.hiddenItem}/estimate`, expect: [401, 200, 200, 200, 403],
		request: () => ({ json: {} }), note: 'a 16 × 16 original: the answer is "no confident blur", still a 200' },
	{ route: '/api/items/[id=id]/streak', method: 'POST', path: (f) => `/api/items/${f.hiddenItem}/streak`, expect: [401, 422, 422, 422, 403],
		request: () => ({ json: { region: { x: 0, y: 0, width: 16, height: 16 } } }),
		note: 'issue 5: a one-colour 16 × 16 original holds no streak, so staff get past the guard to a 422' },
	{ route: '/api/kernels/from-image', method: 'POST', path: () => '/api/kernels/from-image', expect: [401, 200, 200, 200, 403],
		request: async (c) => ({ multipart: await pngFor(c, `matrix-psf-${c}.png`) }),
		note: 'issue 5: an uploaded PSF image becomes an image kernel (a flat 16 × 16 square is a valid box PSF)' },

	// ── custody (issue 4 §4: the lab's record; clients read released reports, not the ledger) ──
	{ route: '/api/items/[id=id]/custody', method: 'GET', path: (f) => `/api/items/${f.hiddenItem}/custody`, expect: [401, 200, 200, 200, 403] },
	{ route: '/api/items/[id=id]/premis', method: 'GET', path: (f) => `/api/items/${f.hiddenItem}/premis`, expect: [401, 200, 200, 200, 403] },
	{ route: '/api/cases/[id=id]/custody', method: 'GET', path: (f) => `/api/cases/${f.memberCase}/custody`, expect: [401, 200, 200, 200, 403] },
	{ route: '/api/custody/verify', method: 'GET', path: () => '/api/custody/verify', expect: [401, 200, 200, 200, 403] },
	{ route: '/custody', method: 'GET', path: () => '/custody', expect: ['signin', 200, 200, 200, 403] },
	{ route: '/custody', method: 'POST', path: () => '/custody?/verify', expect: ['signin', 200, 200, 200, 403], request: () => ({ form: {} }) },

	// ── API tokens (issue 4 §6: created by a signed-in user on their profile page, revocable) ──
	{ route: '/profile', method: 'GET', path: () => '/profile', expect: ['signin', 200, 200, 200, 200] },
	{ route: '/profile', method: 'POST', path: () => '/profile?/create', expect: ['signin', 200, 200, 200, 200],
		request: (c) => ({ form: { name: `matrix page token ${c}` } }),
		effect: async (c, allowed) =>
			expect(Number((await testDb()('api_tokens').where({ name: `matrix page token ${c}` }).count({ n: '*' }).first())?.n)).toBe(allowed ? 1 : 0) },
	{ route: '/api/tokens', method: 'GET', path: () => '/api/tokens', expect: [401, 200, 200, 200, 200] },
	{ route: '/api/tokens', method: 'POST', path: () => '/api/tokens', expect: [401, 201, 201, 201, 201],
		request: (c) => ({ json: { name: `matrix api token ${c}` } }) },
	{ route: '/api/tokens/[id=id]', method: 'DELETE', path: (f) => `/api/tokens/${f.adminToken}`, expect: [401, 200, 404, 404, 404],
		request: async (_c, f) => {
			await testDb()('api_tokens').where({ id: f.adminToken }).update({ revoked_at: null });
			return {};
		},
		note: 'only the owner can revoke a token; to anyone else it does not exist' },

	// ── review and release (issue 6): the guard's answer per role on ids that do not exist; the
	// flows themselves, and a client's 404 on unreleased work, are in review-release.test.ts ──
	{ route: '/runs/[id=id]/submit', method: 'GET', path: () => '/runs/999999/submit', expect: ['signin', 404, 404, 403, 403] },
	{ route: '/runs/[id=id]/submit', method: 'POST', path: () => '/runs/999999/submit', expect: ['signin', 404, 404, 403, 403],
		request: () => ({ form: { statement: 'Matrix statement, long enough.' } }) },
	{ route: '/review', method: 'GET', path: () => '/review', expect: ['signin', 200, 403, 200, 403] },
	{ route: '/review/[id=id]', method: 'GET', path: () => '/review/999999', expect: ['signin', 404, 404, 404, 403] },
	{ route: '/review/[id=id]', method: 'POST', path: () => '/review/999999?/approve', expect: ['signin', 404, 403, 404, 403],
		request: () => ({ form: { comment: '' } }) },
	{ route: '/portal', method: 'GET', path: () => '/portal', expect: ['signin', 403, 403, 403, 200] },
	{ route: '/portal/items/[id=id]', method: 'GET', path: () => '/portal/items/999999', expect: ['signin', 403, 403, 403, 404] },
	{ route: '/verify', method: 'GET', path: () => '/verify', expect: [200, 200, 200, 200, 200], note: 'public: anyone holding a report may check it' },
	{ route: '/verify', method: 'POST', path: () => '/verify?/byId', expect: [200, 200, 200, 200, 200],
		request: () => ({ form: { reportId: 'SPR-2026-0000-0000-0000-0000' } }) },
	{ route: '/api/runs/[id=id]/proposals', method: 'POST', path: () => '/api/runs/999999/proposals', expect: [401, 404, 404, 403, 403],
		request: () => ({ json: { statement: 'Matrix statement, long enough.' } }) },
	{ route: '/api/proposals', method: 'GET', path: () => '/api/proposals', expect: [401, 200, 403, 200, 403] },
	{ route: '/api/proposals/[id=id]', method: 'GET', path: () => '/api/proposals/999999', expect: [401, 404, 404, 404, 403] },
	{ route: '/api/proposals/[id=id]/approve', method: 'POST', path: () => '/api/proposals/999999/approve', expect: [401, 404, 403, 404, 403],
		request: () => ({ json: { comment: '' } }) },
	{ route: '/api/proposals/[id=id]/return', method: 'POST', path: () => '/api/proposals/999999/return', expect: [401, 404, 403, 404, 403],
		request: () => ({ json: { comment: 'Matrix: needs work' } }) },
	{ route: '/api/proposals/[id=id]/release', method: 'POST', path: () => '/api/proposals/999999/release', expect: [401, 404, 403, 404, 403] },
	{ route: '/api/proposals/[id=id]/report', method: 'GET', path: () => '/api/proposals/999999/report', expect: [401, 404, 404, 404, 403] },
	...(['report', 'result', 'png', 'before', 'after'] as const).map((file): Row => ({
		route: `/api/portal/items/[id=id]/${file}`, method: 'GET', path: () => `/api/portal/items/999999/${file}`, expect: [401, 403, 403, 403, 404]
	})),
	{ route: '/api/verify', method: 'POST', path: () => '/api/verify', expect: [200, 200, 200, 200, 200],
		request: () => ({ json: { reportId: 'SPR-2026-0000-0000-0000-0000' } }), note: 'public; an unknown id is an answer (not genuine), not an error' },

	// ── development mailbox (issue 6 §7; on in tests because DEV_MAILBOX_DIR is set) ──
	{ route: '/dev/mailbox', method: 'GET', path: () => '/dev/mailbox', expect: ['signin', 200, 200, 200, 200] },
	{ route: '/api/dev/mailbox', method: 'GET', path: () => '/api/dev/mailbox', expect: [401, 200, 200, 200, 200] }
];

const fixtures = {} as Fixtures;
const sessions = {} as Record<Caller, HttpClient>;

beforeAll(async () => {
	const [admin, technician, supervisor, client] = await Promise.all(
		(['admin', 'technician', 'supervisor', 'client'] as const).map((role) => signIn(role))
	);
	Object.assign(sessions, { anonymous: new HttpClient(), admin, technician, supervisor, client });

	const knex = testDb();
	const clientId = (await knex('users').where({ email: 'client@stillpoint.example' }).first()).id;
	const memberOf = (await knex('case_members').where({ user_id: clientId }).select('case_id')).map((r) => r.case_id);
	fixtures.memberCase = (await knex('cases').whereIn('id', memberOf).orderBy('id').first()).id;
	fixtures.hiddenCase = (await knex('cases').whereNotIn('id', memberOf).orderBy('id').first()).id;
	// Inserted directly (its password is never used), so no bcrypt cost.
	[fixtures.target] = await knex('users').insert({
		name: 'Matrix Target',
		email: 'matrix-target@stillpoint.test',
		role: 'client',
		password_hash: '$2b$12$notarealhashnotarealhashnotarealhashnotarealhashnotr'
	});
	expect(await countRows('users')).toBeGreaterThan(4);

	const uploaded = await technician.post(`/api/cases/${fixtures.hiddenCase}/items`, { multipart: await pngFor('anonymous', 'matrix-fixture.png'), keepJar: true });
	expect(uploaded.status).toBeLessThan(300);
	fixtures.hiddenItem = (await readJson<{ id: number }>(uploaded)).id;
	const queued = await technician.post(`/api/items/${fixtures.hiddenItem}/runs`, { json: RUN_BODY, keepJar: true });
	expect(queued.status).toBe(202);
	fixtures.queuedRun = (await readJson<{ id: number }>(queued)).id;
	const adminId = (await knex('users').where({ email: 'admin@stillpoint.example' }).first()).id;
	[fixtures.adminToken] = await knex('api_tokens').insert({
		user_id: adminId,
		name: 'matrix fixture token',
		token_hash: 'f'.repeat(64),
		token_prefix: 'spt_matrix'
	});
});

afterAll(closeTestDb);

function describeExpected(expected: Expected): string {
	return typeof expected === 'number' ? String(expected) : `303 → ${expected}`;
}

async function assertAnswer(response: Response, expected: Expected, path: string): Promise<void> {
	const location = response.headers.get('location');
	const seen = `${response.status}${location ? ` → ${location}` : ''}`;
	if (typeof expected === 'number') {
		expect(response.status, seen).toBe(expected);
		return;
	}
	expect(response.status, seen).toBe(303);
	if (expected === 'signin') {
		expect(location).toBe(`/signin?redirectTo=${encodeURIComponent(path)}`);
	} else if (expected === 'home') {
		expect(location).toBe('/');
	} else if (expected === 'case') {
		expect(location).toMatch(/^\/cases\/[1-9][0-9]*$/);
	} else {
		expect(location).toBeTruthy();
	}
}

const isAllowed = (expected: Expected) => expected === 200 || expected === 201 || expected === 202 || expected === 'case';

describe.each(TABLE.map((row) => [`${row.method} ${row.route}${row.note ? ` (${row.note})` : ''}`, row] as const))(
	'%s',
	(_name, row) => {
		test.each(CALLERS.map((caller, i) => [caller, describeExpected(row.expect[i]), i] as const))(
			'%s → %s',
			async (caller, _label, i) => {
				const expected = row.expect[i];
				const path = row.path(fixtures);
				const options = { ...((await row.request?.(caller, fixtures)) ?? {}), keepJar: true };
				const session = row.ownSession ? (caller === 'anonymous' ? new HttpClient() : await signInAs(demoUser(caller).email, demoUser(caller).password)) : sessions[caller];
				const response = await session.request(row.method, path, options);
				await assertAnswer(response, expected, path);
				await row.effect?.(caller, isAllowed(expected), fixtures);
				// A signed-out session's cookie, replayed, is refused (src/lib/server/session-revocation.ts).
				if (row.route === '/signout') expect((await session.request('GET', '/api/me')).status).toBe(401);
			}
		);
	}
);

// ── completeness: every route file has a row here and a rule in ROUTE_ACCESS ──────────────────

const ROUTES_DIR = join(process.cwd(), 'src', 'routes');
const HTTP_METHODS = ['GET', 'HEAD', 'POST', 'PUT', 'PATCH', 'DELETE', 'OPTIONS'];

function filesUnder(dir: string): string[] {
	return readdirSync(dir).flatMap((name) => {
		const path = join(dir, name);
		return statSync(path).isDirectory() ? filesUnder(path) : [path];
	});
}

/** SvelteKit's route id for a directory: its path under src/routes, groups `(name)` removed. */
function routeIdOf(dir: string): string {
	const segments = relative(ROUTES_DIR, dir).split(sep).filter((s) => s && !/^\(.*\)$/.test(s));
	return `/${segments.join('/')}`;
}

/** The names a module exports, by reading its source (no import: route files need SvelteKit's runtime). */
function exportedNames(source: string): string[] {
	const names = [...source.matchAll(/export\s+(?:const|let|var|(?:async\s+)?function\*?)\s+([A-Za-z_$][\w$]*)/g)].map((m) => m[1]);
	for (const list of source.matchAll(/export\s*\{([^}]*)\}/g)) {
		for (const item of list[1].split(',')) {
			const name = item.trim().split(/\s+as\s+/).pop();
			if (name) names.push(name);
		}
	}
	return names;
}

/** Every (route id, method) the app serves, from the files SvelteKit builds routes from. */
function servedRoutes(): { route: string; method: string }[] {
	const served = new Map<string, Set<string>>();
	const add = (route: string, method: string) => (served.get(route) ?? served.set(route, new Set()).get(route)!).add(method);
	for (const file of filesUnder(ROUTES_DIR)) {
		const base = file.slice(file.lastIndexOf(sep) + 1);
		const route = routeIdOf(file.slice(0, file.lastIndexOf(sep)));
		if (base === '+page.svelte') add(route, 'GET');
		if (base === '+page.server.ts' || base === '+page.ts') {
			const names = exportedNames(readFileSync(file, 'utf8'));
			if (names.includes('load')) add(route, 'GET');
			if (names.includes('actions')) add(route, 'POST');
		}
		if (base === '+server.ts') {
			const names = exportedNames(readFileSync(file, 'utf8'));
			if (names.includes('fallback')) throw new Error(`${file} exports \`fallback\`: list its methods one by one instead`);
			// HEAD is answered by the GET rule (SvelteKit derives HEAD from GET; the guard does the same).
			for (const method of names.filter((n) => HTTP_METHODS.includes(n))) add(route, method === 'HEAD' ? 'GET' : method);
		}
	}
	return [...served].flatMap(([route, methods]) => [...methods].sort().map((method) => ({ route, method })));
}

const SERVED = servedRoutes();
const servedKey = new Set(SERVED.map((s) => `${s.method} ${s.route}`));

describe('completeness: a new route cannot be forgotten', () => {
	test('the route walk finds the routes issue 2 asks for (so the walk itself works)', () => {
		for (const route of ['/', '/signin', '/signout', '/api/me', '/api/cases', '/api/cases/[id=id]', '/api/users', '/api/users/[id=id]']) {
			expect(SERVED.map((s) => s.route)).toContain(route);
		}
		expect(servedKey).toContain('POST /signout');
		expect(servedKey).toContain('PATCH /api/users/[id=id]');
	});

	test.each(SERVED.map((s) => [s.method, s.route] as const))('%s %s has a row in the matrix', (method, route) => {
		expect(TABLE.some((row) => row.route === route && row.method === method)).toBe(true);
	});

	test.each(SERVED.map((s) => [s.method, s.route] as const))('%s %s has a rule in ROUTE_ACCESS', (method, route) => {
		expect(ROUTE_ACCESS[route]?.[method as keyof (typeof ROUTE_ACCESS)[string]]).toBeDefined();
	});

	test('every matrix row and every ROUTE_ACCESS rule names a route and method the app serves', () => {
		const stale = [
			...TABLE.map((row) => `${row.method} ${row.route}`),
			...Object.entries(ROUTE_ACCESS).flatMap(([route, methods]) => Object.keys(methods).map((m) => `${m} ${route}`))
		].filter((key) => !servedKey.has(key));
		expect([...new Set(stale)]).toEqual([]);
	});
});

// ── a method a route does not serve: 405 with Allow for everyone (RFC 9110 §15.5.6) ───────────────

test('DELETE /api/cases is 405 with an Allow header, signed in or not', async () => {
	for (const caller of ['anonymous', 'admin'] as const) {
		const response = await sessions[caller].request('DELETE', '/api/cases');
		expect(response.status, caller).toBe(405);
		expect(response.headers.get('allow')?.split(', ').sort()).toEqual(['GET', 'HEAD', 'POST']);
	}
});
