import { describe, expect, it } from 'vitest';
import { toLinear } from '../colour';
import { seededRandom } from '../random';
import { createPlane, type RasterImage } from '../types';
import { imageToLinear } from './linear-light';

const bytes = (a: Float32Array) => Buffer.from(a.buffer, a.byteOffset, a.byteLength);

describe('imageToLinear: table lookup for 8/16-bit codes, same bits as colour.ts toLinear', () => {
	it('matches toLinear bit for bit on 8-bit, 16-bit, arbitrary and edge values', () => {
		// Reference: colour.ts toLinear (IEC 61966-2-1:1999 §5.2 formula applied value by value).
		const random = seededRandom(5);
		const values: number[] = [0, -0, 1, 0.04045, Math.fround(0.04045), -0.01, 1.2, 1e-9];
		for (let n = 0; n <= 255; n++) values.push(n / 255);
		for (let n = 0; n <= 65535; n += 7) values.push(n / 65535);
		for (let i = 0; i < 5000; i++) values.push(random());
		const plane = createPlane(1, values.length, Float32Array.from(values));
		const img: RasterImage = { width: values.length, height: 1, planes: [plane], transfer: 'srgb', sourceBitDepth: 16 };
		const ours = imageToLinear(img).planes[0].data;
		const reference = toLinear(img).planes[0].data;
		expect(bytes(ours).equals(bytes(reference))).toBe(true);
		expect(Object.is(ours[1], -0)).toBe(true);
		const linear = { ...img, transfer: 'linear' as const };
		expect(bytes(imageToLinear(linear).planes[0].data).equals(bytes(toLinear(linear).planes[0].data))).toBe(true);
	});

	it('still rejects non-finite values as srgbToLinear does', () => {
		const img: RasterImage = { width: 2, height: 1, planes: [createPlane(1, 2, Float32Array.from([0.5, NaN]))], transfer: 'srgb', sourceBitDepth: 8 };
		expect(() => imageToLinear(img)).toThrow(RangeError);
	});
});
