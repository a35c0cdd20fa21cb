/**
 * The zoom view's server side (issue 5): tile pyramid manifest, tiles and full-resolution regions
 * through the built server. Expected numbers follow from ⌈n/2⌉ level sizes and 256-pixel tiles
 * (our own layout); pixel checks compare the server's PNGs, decoded with sharp, with the uploaded
 * 8-bit RGB original, which display conversion must leave unchanged (common practice, no source).
 */
import { randomBytes, randomUUID } from 'node:crypto';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { signIn } from './support/auth';
import { closeTestDb } from './support/db';
import { HttpClient, readJson } from './support/http';

const WIDTH = 600;
const HEIGHT = 301;
let technician: HttpClient;
let itemId: number;
let original: Buffer;

async function decode(response: Response) {
	expect(response.status).toBe(200);
	expect(response.headers.get('content-type')).toBe('image/png');
	return sharp(Buffer.from(await response.arrayBuffer())).raw().toBuffer({ resolveWithObject: true });
}

/** The original's pixels in a rectangle, row by row (3 samples per pixel). */
function crop(x: number, y: number, width: number, height: number): Buffer {
	const out = Buffer.alloc(width * height * 3);
	for (let row = 0; row < height; row++) original.copy(out, row * width * 3, ((y + row) * WIDTH + x) * 3, ((y + row) * WIDTH + x + width) * 3);
	return out;
}

beforeAll(async () => {
	technician = await signIn('technician');
	const created = await technician.post('/api/cases', {
		json: { title: 'Tile check — gate camera still', reference: `IT-TILES-${randomUUID().slice(0, 8).toUpperCase()}`, kind: 'forensic' }
	});
	expect(created.status).toBe(201);
	const caseId = (await readJson<{ case: { id: number } }>(created)).case.id;
	original = randomBytes(WIDTH * HEIGHT * 3);
	const png = await sharp(original, { raw: { width: WIDTH, height: HEIGHT, channels: 3 } }).png().toBuffer();
	const form = new FormData();
	form.append('file', new Blob([new Uint8Array(png)], { type: 'image/png' }), 'gate-still.png');
	const uploaded = await technician.post(`/api/cases/${caseId}/items`, { multipart: form });
	expect(uploaded.status).toBe(201);
	itemId = (await readJson<{ id: number }>(uploaded)).id;
});

afterAll(async () => {
	await closeTestDb();
});

describe('tile pyramid', () => {
	test('the manifest lists each level with sizes rounded up and its tile grid', async () => {
		const response = await technician.get(`/api/items/${itemId}/tiles`);
		expect(response.status).toBe(200);
		const manifest = await readJson<{ width: number; height: number; tileSize: number; bitDepth: number; note: string; levels: unknown[] }>(response);
		expect(manifest).toMatchObject({ width: WIDTH, height: HEIGHT, tileSize: 256, bitDepth: 8 });
		expect(manifest.levels).toEqual([
			{ level: 0, scale: 1, width: 600, height: 301, columns: 3, rows: 2 },
			{ level: 1, scale: 0.5, width: 300, height: 151, columns: 2, rows: 1 },
			{ level: 2, scale: 0.25, width: 150, height: 76, columns: 1, rows: 1 }
		]);
		expect(manifest.note).toMatch(/8-bit/);
	});

	test('a full-resolution tile holds the original pixels and is cached privately for good', async () => {
		const response = await technician.get(`/api/items/${itemId}/tiles/0/1/0`);
		expect(response.headers.get('cache-control')).toBe('private, max-age=31536000, immutable');
		const { data, info } = await decode(response);
		expect([info.width, info.height, info.channels]).toEqual([256, 256, 3]);
		expect(data.equals(crop(256, 0, 256, 256))).toBe(true);
	});

	test('edge tiles are cropped to the image', async () => {
		const { data, info } = await decode(await technician.get(`/api/items/${itemId}/tiles/0/2/1`));
		// 600 − 512 = 88 wide, 301 − 256 = 45 tall.
		expect([info.width, info.height]).toEqual([88, 45]);
		expect(data.equals(crop(512, 256, 88, 45))).toBe(true);
		const coarse = await decode(await technician.get(`/api/items/${itemId}/tiles/2/0/0`));
		expect([coarse.info.width, coarse.info.height]).toEqual([150, 76]);
	});

	test.each([
		['column past the grid', '0/3/0'],
		['row past the grid', '0/0/2'],
		['level past the pyramid', '3/0/0']
	])('404 for a %s', async (_label, position) => {
		const response = await technician.get(`/api/items/${itemId}/tiles/${position}`);
		expect(response.status).toBe(404);
	});

	test.each([
		['level', 'x/0/0'],
		['column', '0/-1/0'],
		['row', '0/0/1.5']
	])('400 naming the field for a malformed %s', async (field, position) => {
		const response = await technician.get(`/api/items/${itemId}/tiles/${position}`);
		expect(response.status).toBe(400);
		const body = await readJson<{ fields: Record<string, string[]> }>(response);
		expect(Object.keys(body.fields)).toEqual([field]);
	});
});

describe('full-resolution region', () => {
	test('a crop across tile borders equals the original pixels', async () => {
		const { data, info } = await decode(await technician.get(`/api/items/${itemId}/region?x=250&y=250&width=300&height=40`));
		expect([info.width, info.height]).toEqual([300, 40]);
		expect(data.equals(crop(250, 250, 300, 40))).toBe(true);
	});

	test.each([
		['width', 'x=0&y=0&width=0&height=4'],
		['height', 'x=0&y=0&width=4&height=1025'],
		['x', 'x=abc&y=0&width=4&height=4'],
		['y', 'x=0&width=4&height=4'],
		['width', 'x=590&y=0&width=11&height=4'],
		['height', 'x=0&y=300&width=4&height=2']
	])('400 naming %s for %s', async (field, query) => {
		const response = await technician.get(`/api/items/${itemId}/region?${query}`);
		expect(response.status).toBe(400);
		const body = await readJson<{ fields: Record<string, string[]> }>(response);
		expect(Object.keys(body.fields)).toEqual([field]);
	});
});
