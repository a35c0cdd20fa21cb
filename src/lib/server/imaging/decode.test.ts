import { describe, expect, it } from 'vitest';
import { decodeImage } from './decode';
import { ImageInputError } from './errors';
import { handmadeGreyTiff, ramp16, rawImage } from './test-images';

const W = 5;
const H = 3;

function planeValues(image: Awaited<ReturnType<typeof decodeImage>>['image'], c: number): number[] {
	return Array.from(image.planes[c].data as Float32Array);
}

// Expected values are the stored integers divided by 2^bits − 1 (PNG spec, ISO/IEC 15948 §12.1
// sample depth scaling; TIFF 6.0 BitsPerSample), rounded to float32 as the planes are.
describe('decodeImage keeps stored code values', () => {
	it('16-bit grey PNG: every sample exactly v / 65535', async () => {
		const samples = ramp16(W * H);
		const png = await rawImage(samples, W, H, 1).toColourspace('grey16').png().toBuffer();
		const { image, info } = await decodeImage(png);
		expect(info).toMatchObject({ format: 'png', channels: 1, bitDepth: 16, alphaDropped: false });
		expect(image).toMatchObject({ width: W, height: H, transfer: 'srgb', sourceBitDepth: 16 });
		expect(image.planes[0].shape).toEqual([H, W]);
		expect(planeValues(image, 0)).toEqual(Array.from(samples, (v) => Math.fround(v / 65535)));
	});

	it('16-bit RGB TIFF: planes de-interleaved in R, G, B order', async () => {
		const samples = ramp16(W * H * 3);
		const tif = await rawImage(samples, W, H, 3).toColourspace('rgb16').tiff({ compression: 'lzw' }).toBuffer();
		const { image, info } = await decodeImage(tif);
		expect(info).toMatchObject({ format: 'tiff', channels: 3, bitDepth: 16 });
		for (let c = 0; c < 3; c++) {
			const expected = Array.from({ length: W * H }, (_, i) => Math.fround(samples[i * 3 + c] / 65535));
			expect(planeValues(image, c)).toEqual(expected);
		}
	});

	it('16-bit grey TIFF written by hand, not by libvips', async () => {
		const samples = ramp16(W * H);
		const { image, info } = await decodeImage(handmadeGreyTiff(W, H, 16, 1, samples));
		expect(info).toMatchObject({ format: 'tiff', channels: 1, bitDepth: 16 });
		expect(planeValues(image, 0)).toEqual(Array.from(samples, (v) => Math.fround(v / 65535)));
	});

	it('8-bit RGB PNG: v / 255 with no colour conversion', async () => {
		const samples = Uint8Array.from({ length: W * H * 3 }, (_, i) => (i * 37 + 1) % 256);
		const png = await rawImage(samples, W, H, 3).png().toBuffer();
		const { image, info } = await decodeImage(png);
		expect(info).toMatchObject({ channels: 3, bitDepth: 8 });
		expect(image.sourceBitDepth).toBe(8);
		expect(planeValues(image, 1)).toEqual(
			Array.from({ length: W * H }, (_, i) => Math.fround(samples[i * 3 + 1] / 255))
		);
	});

	it('8-bit grey JPEG decodes to one plane', async () => {
		const flat = new Uint8Array(16 * 16).fill(128);
		const jpg = await rawImage(flat, 16, 16, 1).toColourspace('b-w').jpeg({ quality: 95 }).toBuffer();
		const { image, info } = await decodeImage(jpg);
		expect(info).toMatchObject({ format: 'jpeg', channels: 1, bitDepth: 8 });
		// A flat block has only a DC coefficient; baseline JPEG reproduces it within one code
		// value (ITU-T T.81 quantisation of DC). From memory.
		for (const v of planeValues(image, 0)) expect(Math.abs(v * 255 - 128)).toBeLessThanOrEqual(1);
	});

	it('drops alpha explicitly without premultiplying colour', async () => {
		const rgba = Uint8Array.from([10, 20, 30, 0, 200, 100, 50, 128, 1, 2, 3, 255, 9, 9, 9, 77]);
		const png = await rawImage(rgba, 2, 2, 4).png().toBuffer();
		const { image, info } = await decodeImage(png);
		expect(info.alphaDropped).toBe(true);
		expect(image.planes).toHaveLength(3);
		// The fully transparent first pixel keeps its stored colour.
		expect(planeValues(image, 0)).toEqual([10, 200, 1, 9].map((v) => Math.fround(v / 255)));
	});

	it('drops alpha from 16-bit grey+alpha', async () => {
		const ga = Uint16Array.from([1000, 0, 2000, 65535, 3000, 5, 4000, 6]);
		const png = await rawImage(ga, 2, 2, 2).toColourspace('grey16').png().toBuffer();
		const { image, info } = await decodeImage(png);
		expect(info).toMatchObject({ channels: 1, bitDepth: 16, alphaDropped: true });
		expect(planeValues(image, 0)).toEqual([1000, 2000, 3000, 4000].map((v) => Math.fround(v / 65535)));
	});
});

describe('decodeImage refuses what it cannot read faithfully', () => {
	async function reasonOf(bytes: Uint8Array, maxPixels?: number) {
		try {
			await decodeImage(bytes, { maxPixels });
		} catch (e) {
			expect(e).toBeInstanceOf(ImageInputError);
			const err = e as ImageInputError;
			expect(err.message).not.toContain('\n');
			return err.reason;
		}
		throw new Error('expected decodeImage to throw');
	}

	it('detects the type by content: text is not an image whatever its name', async () => {
		expect(await reasonOf(new TextEncoder().encode('hello, this is not a picture'))).toBe('unsupported');
	});

	it('rejects formats outside PNG, TIFF, JPEG', async () => {
		const webp = await rawImage(new Uint8Array(12).fill(90), 2, 2, 3).webp().toBuffer();
		expect(await reasonOf(webp)).toBe('unsupported');
	});

	it('rejects CMYK rather than converting colours silently', async () => {
		const cmyk = await rawImage(new Uint8Array(8 * 8 * 3).fill(90), 8, 8, 3).toColourspace('cmyk').jpeg().toBuffer();
		expect(await reasonOf(cmyk)).toBe('unsupported');
	});

	it('rejects floating-point TIFF', async () => {
		const tif = handmadeGreyTiff(2, 2, 32, 3, [0.5, 0.25, 1, 0]);
		expect(await reasonOf(tif)).toBe('unsupported');
	});

	it('reports a truncated PNG as corrupt', async () => {
		const png = await rawImage(ramp16(64 * 64), 64, 64, 1).toColourspace('grey16').png().toBuffer();
		expect(await reasonOf(png.subarray(0, png.length - 40))).toBe('corrupt');
	});

	it('reports empty input', async () => {
		expect(await reasonOf(new Uint8Array(0))).toBe('empty');
	});

	it('caps the pixel count before decoding', async () => {
		const png = await rawImage(new Uint8Array(10 * 10), 10, 10, 1).png().toBuffer();
		expect(await reasonOf(png, 99)).toBe('too-large');
		await expect(decodeImage(png, { maxPixels: 100 })).resolves.toBeDefined();
	});
});
