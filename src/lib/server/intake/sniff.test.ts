import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { SNIFF_BYTES, sniffFormat } from './sniff';

const pixels = { create: { width: 4, height: 3, channels: 3 as const, background: '#806040' } };

// Real files written by sharp (libjpeg/libpng/libtiff), checked against the published signatures:
// JPEG ITU-T T.81 Annex B (SOI FF D8), PNG ISO/IEC 15948 §5.2, TIFF 6.0 Section 2.
describe('sniffFormat', () => {
	it.each([
		['jpeg', () => sharp(pixels).jpeg().toBuffer()],
		['png', () => sharp(pixels).png().toBuffer()],
		['tiff', () => sharp(pixels).tiff().toBuffer()]
	] as const)('recognises %s written by sharp', async (format, make) => {
		const bytes = await make();
		expect(sniffFormat(bytes.subarray(0, SNIFF_BYTES))).toBe(format);
	});

	it('recognises big-endian ("MM") TIFF', () => {
		expect(sniffFormat(Buffer.from([0x4d, 0x4d, 0x00, 0x2a, 0, 0, 0, 8]))).toBe('tiff');
	});

	it.each([
		['text named .jpg', Buffer.from('hello, this is not a photograph')],
		['GIF', Buffer.from('GIF89a\x01\x00\x01\x00')],
		['WebP', Buffer.from('RIFF\x00\x00\x00\x00WEBP')],
		['BigTIFF (version 43)', Buffer.from([0x49, 0x49, 0x2b, 0x00, 8, 0, 0, 0])],
		['a PNG signature cut short', Buffer.from([0x89, 0x50, 0x4e, 0x47])],
		['nothing', Buffer.alloc(0)]
	])('refuses %s', (_name, head) => {
		expect(sniffFormat(head)).toBeNull();
	});
});
