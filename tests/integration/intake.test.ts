/**
 * Intake through the real server (issue 4 §1–2): originals go in by multipart POST, come out
 * byte for byte, are stored once under their SHA-256 and read-only, and every refused upload
 * leaves nothing behind. Bad uploads go to a second server started here with a small byte
 * limit and its own storage folder, so "nothing behind" can be checked on an empty folder.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { createHash, randomBytes, randomUUID } from 'node:crypto';
import { cpSync, existsSync } from 'node:fs';
import { mkdtemp, readdir, readFile, rm, stat } from 'node:fs/promises';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { config } from '../../src/lib/server/config';
import { pngDeclaring } from '../../src/lib/server/intake/test-files';
import { custodyService } from '../../src/lib/server/services/custody.service';
import { systemClock } from '../../src/lib/server/clock';
import { demoUser, signIn, signInAs } from './support/auth';
import { databaseName, queuePrefix } from './support/context';
import { closeTestDb, countRows, idOf, testDb } from './support/db';
import { HttpClient, readJson, type ApiError } from './support/http';

interface ItemBody {
	id: number;
	caseId: number;
	originalName: string;
	sha256: string;
	md5: string;
	sizeBytes: number;
	format: string;
	width: number;
	height: number;
	bitDepth: number;
	channels: number;
	hasIcc: boolean;
	exif?: Record<string, unknown> | null;
	analysis: { clippedFraction: number; noiseSigma: number[]; workingWidth: number; workingHeight: number };
	duplicate?: boolean;
}

const sha256 = (b: Buffer) => createHash('sha256').update(b).digest('hex');
const md5 = (b: Buffer) => createHash('md5').update(b).digest('hex');

/** POST one file as a browser's FormData would, with the client's session cookie. */
async function upload(client: HttpClient, caseId: number, bytes: Buffer, name: string, type = 'application/octet-stream') {
	const form = new FormData();
	form.append('file', new Blob([new Uint8Array(bytes)], { type }), name);
	return fetch(`${client.base}/api/cases/${caseId}/items`, {
		method: 'POST',
		headers: { origin: client.base, accept: 'application/json', cookie: client.cookieHeader() },
		body: form,
		redirect: 'manual'
	});
}

/** Random pixels, so every run's images are new to the shared storage folder. */
function noise(width: number, height: number, channels: 1 | 3, sixteen = false) {
	const raw = randomBytes(width * height * channels * (sixteen ? 2 : 1));
	return sharp(raw, { raw: { width, height, channels, ...(sixteen ? { depth: 'ushort' as const } : {}) } });
}

async function filesUnder(dir: string): Promise<string[]> {
	if (!existsSync(dir)) return [];
	const entries = await readdir(dir, { recursive: true, withFileTypes: true });
	return entries.filter((e) => e.isFile()).map((e) => join(e.parentPath, e.name));
}

const storageDir = () => resolve(config().STORAGE_DIR);

let technician: HttpClient;
let admin: HttpClient;
let supervisor: HttpClient;
let client: HttpClient;
let secondTechnician: HttpClient;
let caseId: number;
let clientCaseId: number;

beforeAll(async () => {
	[technician, admin, supervisor, client] = await Promise.all([
		signIn('technician'),
		signIn('admin'),
		signIn('supervisor'),
		signIn('client')
	]);
	const created = await technician.post('/api/cases', {
		json: {
			title: 'Intake check — smeared plate, lay-by 3',
			reference: `IT-INTAKE-${randomUUID().slice(0, 8).toUpperCase()}`,
			kind: 'forensic'
		}
	});
	expect(created.status).toBe(201);
	caseId = (await readJson<{ case: { id: number } }>(created)).case.id;
	const email = `it-intake-${randomUUID().slice(0, 8)}@stillpoint.example`;
	const password = `intake-${randomBytes(12).toString('hex')}`;
	const madeUser = await admin.post('/api/users', { json: { name: 'Second technician', email, role: 'technician', password } });
	expect(madeUser.status).toBe(201);
	secondTechnician = await signInAs(email, password);
	// A demo case the demo client is a member of (src/lib/server/demo/scenario.ts).
	clientCaseId = await idOf('cases', { reference: 'QCEU-2026-0142' });
});

afterAll(async () => {
	await closeTestDb();
});

describe('accepted originals', () => {
	const cases = [
		{
			label: 'PNG 8-bit RGB larger than the preview',
			make: () => noise(2200, 1000, 3).png({ compressionLevel: 1 }).toBuffer(),
			name: 'plate-8bit.png',
			expect: { format: 'png', width: 2200, height: 1000, bitDepth: 8, channels: 3 }
		},
		{
			label: 'PNG 16-bit grey',
			make: () => noise(320, 200, 1, true).toColourspace('grey16').png().toBuffer(),
			name: 'scan-grey16.png',
			expect: { format: 'png', width: 320, height: 200, bitDepth: 16, channels: 1 }
		},
		{
			label: 'TIFF 16-bit RGB',
			make: () => noise(300, 180, 3, true).toColourspace('rgb16').tiff({ compression: 'none' }).toBuffer(),
			name: 'master-rgb16.tif',
			expect: { format: 'tiff', width: 300, height: 180, bitDepth: 16, channels: 3 }
		},
		{
			label: 'JPEG with EXIF',
			make: () =>
				noise(640, 480, 3)
					.withExif({ IFD0: { Make: 'Intake rig', Model: 'IT-1' }, IFD2: { DateTimeOriginal: '2026:11:30 14:05:09' } })
					.jpeg({ quality: 92 })
					.toBuffer(),
			name: 'scene — nuit.jpg',
			expect: { format: 'jpeg', width: 640, height: 480, bitDepth: 8, channels: 3 }
		}
	];

	test.each(cases)('$label: 201 with its metadata and digests, stored byte for byte and read-only', async (c) => {
		const bytes = await c.make();
		const response = await upload(technician, caseId, bytes, c.name);
		const body = await readJson<ItemBody>(response);
		expect(response.status, JSON.stringify(body)).toBe(201);
		expect(body).toMatchObject({ ...c.expect, caseId, originalName: c.name, sizeBytes: bytes.length, duplicate: false });
		expect(body.sha256).toBe(sha256(bytes));
		expect(body.md5).toBe(md5(bytes));
		expect(body.analysis.noiseSigma).toHaveLength(c.expect.channels);
		expect(Math.max(body.analysis.workingWidth, body.analysis.workingHeight)).toBeLessThanOrEqual(2048);

		const stored = join(storageDir(), 'originals', body.sha256);
		expect((await readFile(stored)).equals(bytes)).toBe(true);
		expect((await stat(stored)).mode & 0o222).toBe(0);

		const read = await supervisor.getJson<ItemBody>(`/api/items/${body.id}`);
		expect(read).toMatchObject({ id: body.id, sha256: body.sha256, md5: body.md5, ...c.expect });
		if (c.expect.format === 'jpeg') {
			expect(read.exif).toMatchObject({ Make: 'Intake rig', Model: 'IT-1', DateTimeOriginal: '2026-11-30T14:05:09' });
		}

		const head = await supervisor.request('HEAD', `/api/items/${body.id}/original`);
		expect(head.status).toBe(200);
		expect(head.headers.get('repr-digest')).toBe(`sha-256=:${Buffer.from(body.sha256, 'hex').toString('base64')}:`);
		const original = await supervisor.get(`/api/items/${body.id}/original`);
		expect(original.status).toBe(200);
		expect(original.headers.get('content-disposition')).toMatch(/^attachment;/);
		expect(Buffer.from(await original.arrayBuffer()).equals(bytes)).toBe(true);

		const preview = await supervisor.get(`/api/items/${body.id}/preview`, { accept: 'image/png' });
		expect(preview.status).toBe(200);
		expect(preview.headers.get('content-type')).toBe('image/png');
		const meta = await sharp(Buffer.from(await preview.arrayBuffer())).metadata();
		expect(Math.max(meta.width, meta.height)).toBe(Math.min(2048, Math.max(c.expect.width, c.expect.height)));
		expect(meta.depth).toBe('uchar');

		const events = await testDb()('custody_events').where({ item_id: body.id }).orderBy('id');
		expect(events.map((e) => e.action)).toEqual([
			'original_received',
			'digests_computed',
			'metadata_extracted',
			'original_downloaded'
		]);
		expect(events[0].hash_after).toBe(body.sha256);
		expect(events.every((e, i) => i === 0 || e.id > events[i - 1].id)).toBe(true);
	});

	test('a re-upload of the same bytes into the same case is the same item, stored once', async () => {
		const bytes = await noise(64, 64, 3).png().toBuffer();
		const first = await upload(technician, caseId, bytes, 'first.png');
		expect(first.status).toBe(201);
		const item = await readJson<ItemBody>(first);
		const eventsBefore = await countRows('custody_events');

		const again = await upload(admin, caseId, bytes, 'renamed-copy.png');
		expect(again.status).toBe(200);
		expect(await readJson<ItemBody>(again)).toMatchObject({ id: item.id, sha256: item.sha256, duplicate: true });
		expect(await testDb()('items').where({ case_id: caseId, sha256: item.sha256 }).count({ n: '*' })).toEqual([{ n: 1 }]);
		expect(await countRows('custody_events')).toBe(eventsBefore);
	});

	test('the same bytes in another case are a second item sharing the one stored object', async () => {
		const bytes = await noise(48, 48, 3).png().toBuffer();
		const a = await readJson<ItemBody>(await upload(technician, caseId, bytes, 'shared.png'));
		const response = await upload(technician, clientCaseId, bytes, 'shared.png');
		expect(response.status).toBe(201);
		const b = await readJson<ItemBody>(response);
		expect(b.id).not.toBe(a.id);
		expect(b.sha256).toBe(a.sha256);
		const stored = await filesUnder(join(storageDir(), 'originals'));
		expect(stored.filter((p) => p.endsWith(a.sha256))).toHaveLength(1);
	});
});

describe('who sees what', () => {
	let hiddenItem: ItemBody;
	let memberItem: ItemBody;

	beforeAll(async () => {
		hiddenItem = await readJson<ItemBody>(await upload(technician, caseId, await noise(32, 32, 3).png().toBuffer(), 'h.png'));
		memberItem = await readJson<ItemBody>(
			await upload(technician, clientCaseId, await noise(32, 32, 3).png().toBuffer(), 'm.png')
		);
	});

	test.each(['', '/original', '/preview'])('a client gets 404 for %s of an item in a case they are not a member of', async (suffix) => {
		const response = await client.get(`/api/items/${hiddenItem.id}${suffix}`);
		expect(response.status).toBe(404);
		expect((await readJson<ApiError>(response)).error).toBe('Item not found');
	});

	// Issue 6 §5: a client sees an item of their own case only once a result of it is released
	// (tests/integration/review-release.test.ts covers the released side).
	test("a client gets 404 for the item list of a case they are not a member of, and does not see their own case's unreleased items", async () => {
		expect((await client.get(`/api/cases/${caseId}/items`)).status).toBe(404);
		const own = await client.getJson<{ items: ItemBody[] }>(`/api/cases/${clientCaseId}/items`);
		expect(own.items.map((i) => i.id)).not.toContain(memberItem.id);
		expect((await client.get(`/api/items/${memberItem.id}`)).status).toBe(404);
	});

	test('supervisors and clients cannot upload; anonymous callers must sign in', async () => {
		const bytes = await noise(16, 16, 3).png().toBuffer();
		expect((await upload(supervisor, caseId, bytes, 'x.png')).status).toBe(403);
		expect((await upload(client, clientCaseId, bytes, 'x.png')).status).toBe(403);
		expect((await upload(new HttpClient(), caseId, bytes, 'x.png')).status).toBe(401);
	});

	test('an upload into a case that does not exist is 404', async () => {
		const response = await upload(technician, 999_999, await noise(16, 16, 3).png().toBuffer(), 'x.png');
		expect(response.status).toBe(404);
	});
});

describe('concurrent uploads', () => {
	test('20 uploads from several users at once all land once, and the ledger stays intact', async () => {
		const users = [technician, admin, secondTechnician];
		const files = await Promise.all(
			Array.from({ length: 20 }, (_, i) => noise(96 + i, 64, 3).png().toBuffer().then((bytes) => ({ i, bytes })))
		);
		const before = await countRows('items');
		const responses = await Promise.all(
			files.map(async ({ i, bytes }) => {
				const response = await upload(users[i % users.length], caseId, bytes, `burst-${i}.png`);
				return { status: response.status, body: await readJson<ItemBody>(response), bytes };
			})
		);
		expect(responses.map((r) => r.status)).toEqual(Array(20).fill(201));
		expect(new Set(responses.map((r) => r.body.id)).size).toBe(20);
		expect(await countRows('items')).toBe(before + 20);
		for (const { body, bytes } of responses) {
			expect(body.sha256).toBe(sha256(bytes));
			expect((await readFile(join(storageDir(), 'originals', body.sha256))).equals(bytes)).toBe(true);
		}
		const verdict = await custodyService(testDb(), systemClock).verify();
		expect(verdict).toMatchObject({ intact: true, firstBrokenEventId: null });
	});

	test('four racing uploads of the same bytes make one item; the others answer duplicate', async () => {
		const bytes = await noise(200, 150, 3).png().toBuffer();
		const responses = await Promise.all(
			[technician, admin, technician, admin].map(async (user, i) => {
				const response = await upload(user, caseId, bytes, `race-${i}.png`);
				return { status: response.status, body: await readJson<ItemBody>(response) };
			})
		);
		expect(responses.map((r) => r.status).sort()).toEqual([200, 200, 200, 201]);
		expect(new Set(responses.map((r) => r.body.id)).size).toBe(1);
		const rows = await testDb()('items').where({ case_id: caseId, sha256: sha256(bytes) });
		expect(rows).toHaveLength(1);
		const events = await testDb()('custody_events').where({ item_id: rows[0].id, action: 'original_received' });
		expect(events).toHaveLength(1);
	});
});

async function freePort(): Promise<number> {
	return new Promise((done, fail) => {
		const probe = createServer();
		probe.once('error', fail);
		probe.listen(0, '127.0.0.1', () => {
			const { port } = probe.address() as { port: number };
			probe.close(() => done(port));
		});
	});
}

/** A second server from the same build, with a small byte limit and an empty storage folder. */
async function startSmallServer(build: string, storage: string, maxBytes: number): Promise<{ base: string; server: ChildProcess }> {
	const port = await freePort();
	const base = `http://127.0.0.1:${port}`;
	const server = spawn(process.execPath, [build], {
		env: {
			...process.env,
			NODE_ENV: 'production',
			HOST: '127.0.0.1',
			PORT: String(port),
			ORIGIN: base,
			AUTH_SECRET: `intake-small-server-${randomBytes(24).toString('hex')}`,
			DATABASE_NAME: databaseName(),
			QUEUE_PREFIX: queuePrefix(),
			STORAGE_DIR: storage,
			UPLOAD_MAX_BYTES: String(maxBytes),
			BODY_SIZE_LIMIT: '210M'
		},
		stdio: ['ignore', 'ignore', 'pipe']
	});
	server.stderr!.on('data', (chunk: Buffer) => process.stderr.write(chunk.toString().replace(/^/gm, '[small server] ')));
	const deadline = Date.now() + 30_000;
	while (Date.now() < deadline) {
		if (server.exitCode !== null) throw new Error(`the small-limit server exited with ${server.exitCode}`);
		const ok = await fetch(`${base}/signin`).then(
			(r) => r.status === 200,
			() => false
		);
		if (ok) return { base, server };
		await new Promise((r) => setTimeout(r, 200));
	}
	server.kill('SIGTERM');
	throw new Error('the small-limit server did not answer within 30 s');
}

describe('refused uploads leave no stored file and no row', () => {
	const MAX_BYTES = 256 * 1024;
	let storage: string;
	let build: string;
	let small: ChildProcess;
	let tech: HttpClient;

	beforeAll(async () => {
		storage = await mkdtemp(join(tmpdir(), 'stillpoint-intake-it-'));
		// Its own copy of the build, inside the checkout so it resolves node_modules: a rebuild or
		// another suite's set-up replacing the shared copy cannot pull chunks from under it.
		build = resolve(`.data/intake-small-build-${randomUUID().slice(0, 8)}`);
		cpSync(resolve('build'), build, { recursive: true });
		const started = await startSmallServer(build, storage, MAX_BYTES);
		small = started.server;
		tech = new HttpClient(started.base);
		const { email, password } = demoUser('technician');
		const signedIn = await tech.post('/signin', { form: { providerId: 'credentials', email, password, redirectTo: '/' } });
		expect(signedIn.status).toBe(303);
	});

	afterAll(async () => {
		if (small && small.exitCode === null) {
			const exited = new Promise((r) => small.once('exit', r));
			small.kill('SIGTERM');
			await exited;
		}
		await rm(storage, { recursive: true, force: true });
		await rm(build, { recursive: true, force: true });
	});

	const truncatedTiff = async () => {
		const whole = await noise(200, 150, 3).tiff({ compression: 'none' }).toBuffer();
		return whole.subarray(0, Math.floor(whole.length * 0.6));
	};

	test.each([
		{ label: 'a text file named .jpg', status: 415, make: async () => Buffer.from('Not a photograph, just notes.\n'), name: 'evidence.jpg', type: 'image/jpeg' },
		{ label: 'a truncated TIFF', status: 422, make: truncatedTiff, name: 'cut.tif', type: 'image/tiff' },
		{ label: 'a zero-byte file', status: 400, make: async () => Buffer.alloc(0), name: 'empty.png', type: 'image/png' },
		{ label: 'a PNG header declaring 30000 × 30000 pixels', status: 413, make: async () => pngDeclaring(30_000, 30_000), name: 'bomb.png', type: 'image/png' },
		{ label: 'a file one byte over the size limit', status: 413, make: async () => randomBytes(MAX_BYTES + 1), name: 'big.tif', type: 'image/tiff' }
	])('$label → $status', async ({ status, make, name, type }) => {
		const bytes = await make();
		const rowsBefore = await countRows('items');
		const response = await upload(tech, caseId, bytes, name, type);
		const body = await readJson<ApiError>(response);
		expect(response.status, JSON.stringify(body)).toBe(status);
		expect(body.error).toMatch(/\w/);
		expect(await countRows('items')).toBe(rowsBefore);
		expect(await testDb()('items').where({ sha256: sha256(bytes) }).first()).toBeUndefined();
		expect(await filesUnder(storage)).toEqual([]);
	});

	test('a body that is not multipart is 415, and a form without the file field is 400', async () => {
		const notMultipart = await tech.post(`/api/cases/${caseId}/items`, { json: { file: 'x' } });
		expect(notMultipart.status).toBe(415);
		const form = new FormData();
		form.append('note', 'no file here');
		const noFile = await fetch(`${tech.base}/api/cases/${caseId}/items`, {
			method: 'POST',
			headers: { origin: tech.base, cookie: tech.cookieHeader() },
			body: form
		});
		expect(noFile.status).toBe(400);
		expect(await filesUnder(storage)).toEqual([]);
	});

	test('a good file under the limit is still accepted by the same server', async () => {
		const bytes = await noise(40, 40, 3).png().toBuffer();
		const response = await upload(tech, caseId, bytes, 'fine.png');
		expect(response.status).toBe(201);
		const files = await filesUnder(storage);
		expect(files.map((p) => p.slice(storage.length + 1)).sort()).toEqual(
			[`originals/${sha256(bytes)}`, `previews/${sha256(bytes)}-2048.png`].sort()
		);
	});
});
