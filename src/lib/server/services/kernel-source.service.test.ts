import sharp from 'sharp';
import { describe, expect, it, vi } from 'vitest';
import { buildKernel, kernelFromStreak, linearToSrgb } from '../../imaging';
import { InvalidError, TooLargeError, UnprocessableError, UnsupportedMediaError } from '../errors';
import { decodeImage } from '../imaging/decode';
import { readPsf } from '../imaging/psf-file';
import type { ItemRow } from '../repositories/item.repository';
import type { ObjectStorage } from '../storage';
import { linearLuminance } from './estimate.service';
import { decodeRegion, kernelFromUpload, kernelSourceService } from './kernel-source.service';

const W = 96;
const H = 80;
const item = { id: 1, caseId: 1, width: W, height: H, storageKey: 'originals/streak' } as ItemRow;
vi.mock('./item-access', () => ({ visibleItem: vi.fn(async () => item) }));
const user = { id: 1, role: 'technician' } as Parameters<ReturnType<typeof kernelSourceService>['streak']>[0];
const fakeStorage = (bytes: Buffer) => ({ readBuffer: vi.fn(async () => bytes) }) as unknown as ObjectStorage;

/** Park–Miller minimal standard generator (Park & Miller, CACM 31(10), 1988, doi:10.1145/63039.63042). */
function noise(seed: number) {
	let s = seed;
	return () => (s = (s * 16807) % 2147483647) / 2147483647;
}

/**
 * A night scene: dark, slightly noisy background in linear light with one point light smeared
 * along a 15 px line at 30°, centred at (40, 30); stored 16-bit sRGB-encoded RGB, as a camera would.
 */
async function streakPhoto(): Promise<Buffer> {
	const kernel = buildKernel({ kind: 'line', length: 15, angleDeg: 30 });
	const [kh, kw] = kernel.shape;
	const random = noise(7);
	const codes = new Uint16Array(W * H * 3);
	for (let y = 0; y < H; y++) {
		for (let x = 0; x < W; x++) {
			const ky = y - 30 + (kh - 1) / 2;
			const kx = x - 40 + (kw - 1) / 2;
			const light = ky >= 0 && ky < kh && kx >= 0 && kx < kw ? 4 * kernel.get(ky, kx) : 0;
			const linear = Math.min(1, 0.02 + 0.002 * random() + light);
			for (let c = 0; c < 3; c++) codes[(y * W + x) * 3 + c] = Math.round(linearToSrgb(linear) * 65535);
		}
	}
	return sharp(codes, { raw: { width: W, height: H, channels: 3 } }).toColourspace('rgb16').png().toBuffer();
}

describe('decodeRegion', () => {
	it.each([
		['16-bit RGB PNG', async () => streakPhoto()],
		['16-bit grey PNG', async () => sharp(await streakPhoto()).toColourspace('grey16').png().toBuffer()],
		['8-bit RGB JPEG', async () => sharp(await streakPhoto()).jpeg({ quality: 85 }).toBuffer()],
		['8-bit RGBA PNG', async () => sharp(await streakPhoto()).toColourspace('srgb').ensureAlpha(0.5).png().toBuffer()]
	])('%s: exactly the pixels of that rectangle of the full decode', async (_name, make) => {
		const bytes = await make();
		const rect = { x: 17, y: 9, width: 40, height: 33 };
		const full = (await decodeImage(bytes)).image;
		const part = (await decodeRegion(bytes, rect)).image;
		expect([part.width, part.height, part.sourceBitDepth, part.planes.length]).toEqual([rect.width, rect.height, full.sourceBitDepth, full.planes.length]);
		full.planes.forEach((plane, c) => {
			for (let i = 0; i < rect.height; i++) {
				for (let j = 0; j < rect.width; j++) expect(part.planes[c].data[i * rect.width + j]).toBe(plane.data[(rect.y + i) * W + rect.x + j]);
			}
		});
	});
});

describe('kernelSourceService.streak', () => {
	it('is the engine’s kernelFromStreak of the original’s linear luminance in that box, value for value', async () => {
		const bytes = await streakPhoto();
		const region = { x: 24, y: 14, width: 33, height: 33 };
		const kernel = await kernelSourceService({} as never, fakeStorage(bytes)).streak(user, 1, region);
		const expected = kernelFromStreak(linearLuminance((await decodeImage(bytes)).image), region);
		expect(kernel).toEqual(expected);
		expect(kernel.origin).toBe('streak');
		// The streak runs up-right at 30°: the recovered kernel is wider than tall (the drawn line is 15 × ~8.5 px).
		expect(kernel.width).toBeGreaterThan(kernel.height);
	});

	it('refuses a box outside the image before reading the original, and a box without a streak with 422', async () => {
		const empty = fakeStorage(Buffer.alloc(0));
		await expect(kernelSourceService({} as never, empty).streak(user, 1, { x: 80, y: 0, width: 20, height: 20 })).rejects.toBeInstanceOf(InvalidError);
		expect(empty.readBuffer).not.toHaveBeenCalled();
		const flat = await sharp({ create: { width: W, height: H, channels: 3, background: { r: 40, g: 40, b: 40 } } }).png().toBuffer();
		const refusal = kernelSourceService({} as never, fakeStorage(flat)).streak(user, 1, { x: 0, y: 0, width: 30, height: 30 });
		await expect(refusal).rejects.toBeInstanceOf(UnprocessableError);
		await expect(refusal).rejects.toThrow(/no streak/i);
	});
});

describe('kernelFromUpload', () => {
	const psfPng = async (size = 9) => {
		const values = Buffer.alloc(size * size);
		for (let i = 2; i < size - 2; i++) values[4 * size + i] = 200;
		return sharp(values, { raw: { width: size, height: size, channels: 1 } }).toColourspace('b-w').png().toBuffer();
	};

	it('reads the image as the command line does (readPsf) and reports what it was', async () => {
		const bytes = await psfPng();
		const { kernel, source } = await kernelFromUpload(bytes, 'spot.png');
		expect(kernel).toEqual((await readPsf(bytes, 'spot.png')).spec);
		expect(kernel).toMatchObject({ kind: 'image', origin: 'upload', width: 5, height: 1 });
		expect(source).toMatchObject({ format: 'png', width: 9, height: 9, bitDepth: 8, channelReduction: 'none' });
		expect(source.sha256).toMatch(/^[0-9a-f]{64}$/);
	});

	it('refuses non-images (also a JSON spec), oversized pictures, empty files and black pictures', async () => {
		await expect(kernelFromUpload(Buffer.from('hello'), 'a.txt')).rejects.toBeInstanceOf(UnsupportedMediaError);
		await expect(kernelFromUpload(Buffer.from('{"kind":"disk","radius":2}'), 'k.json')).rejects.toBeInstanceOf(UnsupportedMediaError);
		await expect(kernelFromUpload(Buffer.alloc(0), 'empty.png')).rejects.toBeInstanceOf(InvalidError);
		const huge = await sharp({ create: { width: 1100, height: 1000, channels: 3, background: { r: 0, g: 0, b: 0 } } }).png().toBuffer();
		await expect(kernelFromUpload(huge, 'huge.png')).rejects.toBeInstanceOf(TooLargeError);
		const black = await sharp({ create: { width: 8, height: 8, channels: 3, background: { r: 0, g: 0, b: 0 } } }).png().toBuffer();
		await expect(kernelFromUpload(black, 'black.png')).rejects.toBeInstanceOf(UnprocessableError);
		await expect(kernelFromUpload((await psfPng()).subarray(0, 30), 'cut.png')).rejects.toBeInstanceOf(UnprocessableError);
	});
});
