import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { decodeImage } from './decode';
import { encodePng, encodeTiff16, quantise } from './encode';
import { rasterFrom } from './test-images';

const W = 6;
const H = 4;
const values = (seed: number) => Array.from({ length: W * H }, (_, i) => ((i * 0.137 + seed) % 1.0));

/**
 * Tags of the first IFD of a little-endian TIFF and their first SHORT value (TIFF 6.0,
 * Adobe 1992, §2: 12-byte entries of tag, type, count, value).
 */
function tiffTags(bytes: Uint8Array): Map<number, number> {
	const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	expect(view.getUint16(0, true)).toBe(0x4949);
	const ifd = view.getUint32(4, true);
	const count = view.getUint16(ifd, true);
	const tags = new Map<number, number>();
	for (let i = 0; i < count; i++) {
		const at = ifd + 2 + i * 12;
		tags.set(view.getUint16(at, true), view.getUint16(at + 8, true));
	}
	return tags;
}

/** Chunk types of a PNG stream (ISO/IEC 15948 §5.3: length, type, data, CRC). */
function pngChunks(bytes: Uint8Array): string[] {
	const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	const types: string[] = [];
	for (let at = 8; at < bytes.length; ) {
		const length = view.getUint32(at);
		types.push(String.fromCharCode(...bytes.subarray(at + 4, at + 8)));
		at += 12 + length;
	}
	return types;
}

describe('encodeTiff16', () => {
	it('round-trips RGB through 16 bits: decode(encode(x)) = round(x · 65535) / 65535', async () => {
		const img = rasterFrom(W, H, [values(0.1), values(0.5), values(0.9)]);
		const { bytes } = await encodeTiff16(img);
		const meta = await sharp(bytes).metadata();
		expect(meta).toMatchObject({ format: 'tiff', depth: 'ushort', channels: 3 });
		// Tag 259 Compression = 8 is Adobe Deflate (TIFF Technical Note 2; libtiff COMPRESSION_ADOBE_DEFLATE).
		expect(tiffTags(bytes).get(259)).toBe(8);
		const { image } = await decodeImage(bytes);
		img.planes.forEach((plane, c) => {
			const expected = Array.from(plane.data as Float32Array, (v) => Math.fround(Math.round(v * 65535) / 65535));
			expect(Array.from(image.planes[c].data as Float32Array)).toEqual(expected);
		});
	});

	it('writes one grey channel for a one-plane image', async () => {
		const { bytes } = await encodeTiff16(rasterFrom(W, H, [values(0.3)]));
		expect(await sharp(bytes).metadata()).toMatchObject({ channels: 1, depth: 'ushort', space: 'grey16' });
	});

	// Reproducibility: the same pixels must give the same bytes on any run (issue 3, item 7),
	// so no time stamp may enter the file: TIFF 6.0 tag 306 is DateTime.
	it('is deterministic and carries no DateTime tag', async () => {
		const img = rasterFrom(W, H, [values(0.2), values(0.4), values(0.6)]);
		const a = (await encodeTiff16(img)).bytes;
		const b = (await encodeTiff16(img)).bytes;
		expect(a.equals(b)).toBe(true);
		expect(tiffTags(a).has(306)).toBe(false);
		expect(tiffTags(a).get(277)).toBe(3);
	});
});

describe('encodePng', () => {
	it.each([8, 16] as const)('writes %i-bit samples that decode back to the quantised values', async (bits) => {
		const img = rasterFrom(W, H, [values(0.7)]);
		const { bytes } = await encodePng(img, bits);
		const { image, info } = await decodeImage(bytes);
		expect(info.bitDepth).toBe(bits);
		const max = 2 ** bits - 1;
		expect(Array.from(image.planes[0].data as Float32Array)).toEqual(
			Array.from(img.planes[0].data as Float32Array, (v) => Math.fround(Math.round(v * max) / max))
		);
	});

	// ISO/IEC 15948 §11.3.6.1: tIME holds the last-modification time; it would break replay.
	it('has no tIME chunk and is deterministic', async () => {
		const img = rasterFrom(W, H, [values(0.1), values(0.2), values(0.3)]);
		const a = (await encodePng(img, 16)).bytes;
		expect(pngChunks(a)).not.toContain('tIME');
		expect(pngChunks(a)).toContain('IDAT');
		expect(a.equals((await encodePng(img, 16)).bytes)).toBe(true);
	});
});

describe('quantise', () => {
	it('clamps overshoot into [0, 1] and counts it', () => {
		const { samples, quantisation } = quantise(rasterFrom(3, 1, [[-0.2, 0.5, 1.3]]), 16);
		expect(Array.from(samples)).toEqual([0, 32768, 65535]);
		expect(quantisation).toEqual({ belowZero: 1, aboveOne: 1 });
	});

	it('refuses non-finite values instead of writing them as black', () => {
		expect(() => quantise(rasterFrom(2, 1, [[0.5, Number.NaN]]), 8)).toThrow(RangeError);
	});

	it('refuses two planes (neither grey nor RGB)', () => {
		expect(() => quantise(rasterFrom(1, 1, [[0], [1]]), 8)).toThrow(RangeError);
	});
});
