import { randomBytes } from 'node:crypto';
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { TooLargeError, UnprocessableError, UnsupportedMediaError } from '../errors';
import type { ImageFormat } from '../repositories/item.repository';
import { analyse } from './analysis';
import { readHeader, verifyDecodes } from './inspect';
import { crc32, pngDeclaring } from './test-files';

const LIMIT = 100_000_000;
let dir: string;
let n = 0;

async function file(bytes: Buffer): Promise<string> {
	const path = join(dir, `f${n++}`);
	await writeFile(path, bytes);
	return path;
}

function noise(width: number, height: number, channels: 1 | 3 | 4, sixteen = false) {
	const raw = randomBytes(width * height * channels * (sixteen ? 2 : 1));
	return sharp(raw, { raw: { width, height, channels, ...(sixteen ? { depth: 'ushort' as const } : {}) } });
}

beforeAll(async () => {
	dir = await mkdtemp(join(tmpdir(), 'stillpoint-inspect-'));
});
afterAll(() => rm(dir, { recursive: true, force: true }));

describe('crc32', () => {
	it('gives the CRC-32 check value for "123456789" (0xCBF43926)', () => {
		// The standard check value of CRC-32/ISO-HDLC, the PNG chunk CRC (ISO/IEC 15948 Annex D).
		expect(crc32(Buffer.from('123456789'))).toBe(0xcbf43926);
	});
});

describe('readHeader', () => {
	it('reads a 16-bit grey PNG as 1 channel, 16 bits', async () => {
		const path = await file(await noise(40, 30, 1, true).toColourspace('grey16').png().toBuffer());
		expect(await readHeader(path, 'png', LIMIT)).toMatchObject({
			format: 'png', width: 40, height: 30, bitDepth: 16, channels: 1, hasAlpha: false
		});
	});

	it('reads an uncompressed 16-bit RGB TIFF as 3 channels, 16 bits', async () => {
		// sharp's TIFF default is JPEG compression at 8 bits; archival masters are uncompressed or lossless.
		const path = await file(await noise(30, 20, 3, true).toColourspace('rgb16').tiff({ compression: 'none' }).toBuffer());
		expect(await readHeader(path, 'tiff', LIMIT)).toMatchObject({ format: 'tiff', bitDepth: 16, channels: 3 });
	});

	it('reads RGBA as 3 colour channels with the alpha noted', async () => {
		const path = await file(await noise(20, 10, 4).png().toBuffer());
		expect(await readHeader(path, 'png', LIMIT)).toMatchObject({ channels: 3, hasAlpha: true, bitDepth: 8 });
	});

	it('refuses a header declaring 30000 × 30000 pixels before decoding anything', async () => {
		const path = await file(pngDeclaring(30_000, 30_000));
		await expect(readHeader(path, 'png', LIMIT)).rejects.toBeInstanceOf(TooLargeError);
	});

	it('refuses CMYK', async () => {
		const path = await file(await noise(16, 16, 3).toColourspace('cmyk').jpeg().toBuffer());
		await expect(readHeader(path, 'jpeg', LIMIT)).rejects.toBeInstanceOf(UnsupportedMediaError);
	});

	it('refuses content that starts like one format and is another', async () => {
		const path = await file(await noise(8, 8, 3).png().toBuffer());
		await expect(readHeader(path, 'tiff', LIMIT)).rejects.toBeInstanceOf(UnprocessableError);
	});
});

describe('verifyDecodes', () => {
	it.each([
		['PNG', () => noise(256, 256, 3).png({ compressionLevel: 0 }).toBuffer()],
		['JPEG', () => noise(256, 256, 3).jpeg().toBuffer()],
		['TIFF', () => noise(256, 256, 3).tiff({ compression: 'none' }).toBuffer()]
	])('accepts a whole %s and refuses it cut in half', async (name, make) => {
		const bytes = await make();
		await expect(verifyDecodes(await file(bytes), LIMIT)).resolves.toBeUndefined();
		const truncated = await file(bytes.subarray(0, Math.floor(bytes.length / 2)));
		await expect(
			readHeader(truncated, name.toLowerCase() as ImageFormat, LIMIT).then(() => verifyDecodes(truncated, LIMIT))
		).rejects.toBeInstanceOf(UnprocessableError);
	});
});

describe('analyse', () => {
	it('reports the clipped share and a noise estimate per channel on a working copy of at most 2048 px', async () => {
		// Left half white (clipped), right half mid grey: the clipped share is one half.
		const width = 3000;
		const height = 1000;
		const raw = Buffer.alloc(width * height * 3, 128);
		for (let y = 0; y < height; y++) raw.fill(255, y * width * 3, (y * width + width / 2) * 3);
		const path = await file(await sharp(raw, { raw: { width, height, channels: 3 } }).png().toBuffer());
		const header = await readHeader(path, 'png', LIMIT);
		const result = await analyse(path, header, LIMIT);
		expect(result.workingWidth).toBe(2048);
		expect(result.workingHeight).toBe(683);
		expect(result.clippedFraction).toBeCloseTo(0.5, 2);
		// Flat halves: Immerkær's operator answers only at the one vertical edge.
		expect(result.noiseSigma).toHaveLength(3);
		for (const sigma of result.noiseSigma) expect(sigma).toBeLessThan(0.01);
	});
});
