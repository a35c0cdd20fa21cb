import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { plainJson, readExif } from './metadata';

describe('plainJson', () => {
	it('keeps scalars, writes dates as ISO 8601 local date-times, drops binary and huge values', () => {
		const value = {
			Make: 'Example',
			ExposureTime: 0.004,
			Flash: false,
			DateTimeOriginal: new Date(2024, 4, 17, 9, 3, 7),
			MakerNote: new Uint8Array([1, 2, 3]),
			thumbnail: Buffer.from([0xff, 0xd8]),
			StripOffsets: Array.from({ length: 1000 }, (_, i) => i),
			GPSLatitude: [51, 30, 26.4],
			Bad: Number.NaN,
			nested: { ok: 1, blob: new ArrayBuffer(4) }
		};
		expect(plainJson(value)).toEqual({
			Make: 'Example',
			ExposureTime: 0.004,
			Flash: false,
			DateTimeOriginal: '2024-05-17T09:03:07',
			GPSLatitude: [51, 30, 26.4],
			nested: { ok: 1 }
		});
	});
});

describe('readExif', () => {
	let dir: string;
	beforeAll(async () => {
		dir = await mkdtemp(join(tmpdir(), 'stillpoint-exif-'));
	});
	afterAll(() => rm(dir, { recursive: true, force: true }));

	it('reads tags that sharp wrote into a JPEG', async () => {
		const path = join(dir, 'tagged.jpg');
		const bytes = await sharp({ create: { width: 8, height: 8, channels: 3, background: '#333' } })
			.withExif({ IFD0: { Make: 'Stillpoint test rig', Model: 'Unit 7' }, IFD2: { DateTimeOriginal: '2024:05:17 09:03:07' } })
			.jpeg()
			.toBuffer();
		await writeFile(path, bytes);
		const { exif, status } = await readExif(path);
		expect(status).toBe('read');
		expect(exif).toMatchObject({ Make: 'Stillpoint test rig', Model: 'Unit 7', DateTimeOriginal: '2024-05-17T09:03:07' });
	});

	it('answers none for a PNG without EXIF', async () => {
		const path = join(dir, 'plain.png');
		await sharp({ create: { width: 8, height: 8, channels: 3, background: '#333' } }).png().toFile(path);
		expect(await readExif(path)).toEqual({ exif: null, status: 'none' });
	});
});
