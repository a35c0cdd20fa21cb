import sharp from 'sharp';
import { describe, expect, it, vi } from 'vitest';
import { buildKernel, createPlane, linearToSrgb } from '../../imaging';
import { blurredScene } from '../../imaging/estimation/testing';
import { InvalidError, UnprocessableError, UnsupportedMediaError } from '../errors';
import type { ItemRow } from '../repositories/item.repository';
import type { ObjectStorage } from '../storage';
import { estimateService, linearLuminance } from './estimate.service';

const SIZE = 384;
const item = { id: 1, caseId: 1, width: SIZE, height: SIZE, storageKey: 'originals/abc' } as ItemRow;
vi.mock('./item-access', () => ({ visibleItem: vi.fn(async () => item) }));

/** A 16-bit grey PNG of a scene blurred in linear light and stored sRGB-encoded, as a camera would. */
async function motionBlurredPng(): Promise<Buffer> {
	const linear = blurredScene(buildKernel({ kind: 'line', length: 14, angleDeg: 30 }), SIZE, 0.003, 77);
	const codes = Uint16Array.from(linear.data, (v) => Math.round(Math.min(1, Math.max(0, linearToSrgb(Math.max(0, v)))) * 65535));
	// A Uint16Array tells sharp the samples are 16-bit.
	return sharp(codes, { raw: { width: SIZE, height: SIZE, channels: 1 } }).toColourspace('grey16').png().toBuffer();
}

function fakeStorage(bytes: Buffer): ObjectStorage {
	return { readBuffer: vi.fn(async () => bytes) } as unknown as ObjectStorage;
}

const user = { id: 1, role: 'technician' } as Parameters<ReturnType<typeof estimateService>['estimate']>[0];

describe('estimateService', () => {
	it('decodes the original to linear luminance and proposes the motion blur it carries', async () => {
		const store = fakeStorage(await motionBlurredPng());
		const result = await estimateService({} as never, store).estimate(user, 1, {});
		expect(store.readBuffer).toHaveBeenCalledWith('originals/abc');
		expect(result.verdict).toBe('motion');
		const kernel = result.proposals[0].kernel;
		if (kernel.kind !== 'line') throw new Error('expected a line');
		expect(Math.abs(kernel.length - 14)).toBeLessThan(1.5);
		expect(Math.min(Math.abs(kernel.angleDeg - 30), 180 - Math.abs(kernel.angleDeg - 30))).toBeLessThan(3);
		// The JSON stays small and the spectrum is a PNG a browser can show.
		expect(JSON.stringify(result).length).toBeLessThan(1_000_000);
		const meta = await sharp(Buffer.from(result.spectrum!.png!, 'base64')).metadata();
		expect([meta.format, meta.width, meta.height]).toEqual(['png', 256, 256]);
	});

	it('refuses a region outside the image before reading the original', async () => {
		const store = fakeStorage(Buffer.alloc(0));
		await expect(estimateService({} as never, store).estimate(user, 1, { region: { x: 300, y: 0, width: 100, height: 100 } })).rejects.toBeInstanceOf(InvalidError);
		expect(store.readBuffer).not.toHaveBeenCalled();
	});

	it('maps an unknown format to 415 and a truncated original to 422', async () => {
		await expect(estimateService({} as never, fakeStorage(Buffer.from('not an image'))).estimate(user, 1, {})).rejects.toBeInstanceOf(UnsupportedMediaError);
		const truncated = (await motionBlurredPng()).subarray(0, 2000);
		await expect(estimateService({} as never, fakeStorage(truncated)).estimate(user, 1, {})).rejects.toBeInstanceOf(UnprocessableError);
	});
});

describe('linearLuminance', () => {
	it('weights linear RGB by 0.2126, 0.7152, 0.0722 after the sRGB decode (IEC 61966-2-1)', () => {
		const one = (v: number) => createPlane(1, 1, Float32Array.of(v));
		const y = linearLuminance({ width: 1, height: 1, planes: [one(1), one(0), one(128 / 255)], transfer: 'srgb', sourceBitDepth: 8 });
		// sRGB code 128/255 decodes to ((0.50196 + 0.055) / 1.055)^2.4 = 0.21586 (IEC 61966-2-1).
		expect(y.data[0]).toBeCloseTo(0.2126 + 0.0722 * 0.21586, 5);
	});
});
