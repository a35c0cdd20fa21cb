/**
 * Kernels from pictures through the real server (issue 5): a point light's streak boxed in an
 * uploaded original becomes the engine's `image` kernel, and an uploaded PSF image does too; the
 * refusals name the field or say what was wrong with the file.
 */
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { buildKernel, kernelFromStreak } from '../../src/lib/imaging';
import { decodeImage } from '../../src/lib/server/imaging/decode';
import { linearLuminance } from '../../src/lib/server/services/estimate.service';
import { signIn } from './support/auth';
import { closeTestDb, testDb } from './support/db';
import { readJson, type ApiError, type HttpClient } from './support/http';

const W = 120;
const H = 90;
let technician: HttpClient;
let itemId: number;
let photo: Buffer;

/** A dark 8-bit photo with one point light smeared along a 13 px line at 20°, centred at (60, 45). */
async function streakPhoto(): Promise<Buffer> {
	const kernel = buildKernel({ kind: 'line', length: 13, angleDeg: 20 });
	const [kh, kw] = kernel.shape;
	const bytes = Buffer.alloc(W * H * 3, 12);
	for (let i = 0; i < kh; i++) {
		for (let j = 0; j < kw; j++) {
			const v = Math.min(255, 12 + Math.round(2000 * kernel.get(i, j)));
			const at = ((45 - (kh - 1) / 2 + i) * W + 60 - (kw - 1) / 2 + j) * 3;
			bytes.fill(v, at, at + 3);
		}
	}
	return sharp(bytes, { raw: { width: W, height: H, channels: 3 } }).png().toBuffer();
}

function upload(bytes: Buffer | Uint8Array, name: string): FormData {
	const form = new FormData();
	form.append('file', new Blob([new Uint8Array(bytes)], { type: 'application/octet-stream' }), name);
	return form;
}

beforeAll(async () => {
	technician = await signIn('technician');
	const caseId = (await testDb()('cases').orderBy('id').first()).id;
	photo = await streakPhoto();
	const response = await technician.post(`/api/cases/${caseId}/items`, { multipart: upload(photo, 'kernel-sources-streak.png') });
	expect(response.status).toBeLessThan(300);
	itemId = (await readJson<{ id: number }>(response)).id;
});

afterAll(closeTestDb);

describe('POST /api/items/{id}/streak', () => {
	test('a box around the streak gives the engine’s kernel of that crop in linear light', async () => {
		const region = { x: 44, y: 30, width: 33, height: 31 };
		const response = await technician.post(`/api/items/${itemId}/streak`, { json: { region } });
		expect(response.status).toBe(200);
		const body = await readJson<{ kernel: { kind: string; origin: string; width: number; height: number; data: number[] } }>(response);
		const expected = kernelFromStreak(linearLuminance((await decodeImage(photo)).image), region);
		expect(body.kernel).toEqual(expected);
		expect(body.kernel.origin).toBe('streak');
	});

	test('a box over plain background is a 422 that says no streak was found', async () => {
		const response = await technician.post(`/api/items/${itemId}/streak`, { json: { region: { x: 0, y: 0, width: 20, height: 20 } } });
		expect(response.status).toBe(422);
		expect((await readJson<ApiError>(response)).error).toMatch(/no streak/i);
	});

	test('a box outside the image or too large is refused on the region field', async () => {
		const outside = await technician.post(`/api/items/${itemId}/streak`, { json: { region: { x: 100, y: 0, width: 40, height: 10 } } });
		expect(outside.status).toBe(400);
		expect((await readJson<ApiError>(outside)).fields?.region?.[0]).toMatch(/inside the 120×90 image/);
		const large = await technician.post(`/api/items/${itemId}/streak`, { json: { region: { x: 0, y: 0, width: 300, height: 10 } } });
		expect(large.status).toBe(400);
		expect((await readJson<ApiError>(large)).fields?.['region.width']?.[0]).toMatch(/at most 257/);
	});
});

describe('POST /api/kernels/from-image', () => {
	test('a PSF image becomes an upload image kernel', async () => {
		const values = Buffer.alloc(11 * 11);
		for (let j = 3; j < 8; j++) values[5 * 11 + j] = 180;
		const png = await sharp(values, { raw: { width: 11, height: 11, channels: 1 } }).toColourspace('b-w').png().toBuffer();
		const response = await technician.post('/api/kernels/from-image', { multipart: upload(png, 'spot.png') });
		expect(response.status).toBe(200);
		const body = await readJson<{ kernel: Record<string, unknown>; source: Record<string, unknown> }>(response);
		expect(body.kernel).toMatchObject({ kind: 'image', origin: 'upload', width: 5, height: 1 });
		expect(body.source).toMatchObject({ format: 'png', width: 11, height: 11 });
	});

	test('text is 415, a huge picture 413, a black one 422', async () => {
		const text = await technician.post('/api/kernels/from-image', { multipart: upload(Buffer.from('not an image'), 'notes.txt') });
		expect(text.status).toBe(415);
		expect((await readJson<ApiError>(text)).error).toMatch(/not a PNG, TIFF or JPEG/);
		const huge = await sharp({ create: { width: 1200, height: 1000, channels: 3, background: { r: 0, g: 0, b: 0 } } }).png().toBuffer();
		const tooLarge = await technician.post('/api/kernels/from-image', { multipart: upload(huge, 'huge.png') });
		expect(tooLarge.status).toBe(413);
		const black = await sharp({ create: { width: 9, height: 9, channels: 3, background: { r: 0, g: 0, b: 0 } } }).png().toBuffer();
		const none = await technician.post('/api/kernels/from-image', { multipart: upload(black, 'black.png') });
		expect(none.status).toBe(422);
		expect((await readJson<ApiError>(none)).error).toMatch(/positive sum/);
	});
});
