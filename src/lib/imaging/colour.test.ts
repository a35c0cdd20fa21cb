import { describe, expect, it } from 'vitest';
import { linearToSrgb, linearToSrgbArray, srgbToLinear, toLinear, toSrgb } from './colour';
import { createPlane } from './types';

describe('sRGB transfer (IEC 61966-2-1)', () => {
	it('decodes the breakpoint on the linear segment and above it on the power segment', () => {
		// IEC 61966-2-1 §5.2: c ≤ 0.04045 → c/12.92, giving 0.0031308 at the breakpoint.
		expect(srgbToLinear(0.04045)).toBeCloseTo(0.04045 / 12.92, 15);
		expect(srgbToLinear(0.04045)).toBeCloseTo(0.0031308, 6);
		// IEC 61966-2-1 §5.2: c > 0.04045 → ((c + 0.055)/1.055)^2.4.
		expect(srgbToLinear(0.5)).toBeCloseTo(Math.pow(0.555 / 1.055, 2.4), 15);
		expect(srgbToLinear(0.5)).toBeCloseTo(0.21404, 5);
		expect(srgbToLinear(0)).toBe(0);
		expect(srgbToLinear(1)).toBeCloseTo(1, 15);
	});

	it('encodes the breakpoint and the ends (IEC 61966-2-1 §5.3)', () => {
		expect(linearToSrgb(0.0031308)).toBeCloseTo(12.92 * 0.0031308, 15);
		expect(linearToSrgb(0.0031308)).toBeCloseTo(0.04045, 5);
		expect(linearToSrgb(0.21404114)).toBeCloseTo(0.5, 6);
		expect(linearToSrgb(1)).toBeCloseTo(1, 15);
	});

	it('the two segments meet at the breakpoint to 1e-7 (IEC 61966-2-1 constants)', () => {
		const powerSide = Math.pow((0.04045 + 0.055) / 1.055, 2.4);
		expect(Math.abs(powerSide - 0.04045 / 12.92)).toBeLessThan(1e-7);
	});

	it('round-trips every 8-bit code', () => {
		for (let c = 0; c <= 255; c++) expect(linearToSrgb(srgbToLinear(c / 255))).toBeCloseTo(c / 255, 12);
	});

	it('rejects non-finite values with RangeError', () => {
		expect(() => srgbToLinear(Number.NaN)).toThrow(RangeError);
		expect(() => linearToSrgb(Infinity)).toThrow(RangeError);
	});

	it('converts whole images and records the transfer', () => {
		const plane = createPlane(1, 3, Float32Array.from([0, 0.5, 1]));
		const img = { width: 3, height: 1, planes: [plane], transfer: 'srgb' as const, sourceBitDepth: 8 as const };
		const lin = toLinear(img);
		expect(lin.transfer).toBe('linear');
		expect(lin.planes[0].data[1]).toBeCloseTo(0.21404, 5);
		expect(plane.data[1]).toBe(0.5);
		const back = toSrgb(lin);
		expect(back.transfer).toBe('srgb');
		expect(back.planes[0].data[1]).toBeCloseTo(0.5, 6);
	});

	it('linearToSrgbArray gives the bits of linearToSrgb on float32 values, in place too', () => {
		// Reference: linearToSrgb above (IEC 61966-2-1 §5.3 formula, Math.pow) rounded to float32.
		// Every 61st float32 bit pattern from 0.003 to just above 1 (≈ 1.2 million values, all binades
		// of the power segment), the ends, the breakpoint, and values outside [0, 1].
		const bits = new Uint32Array(1);
		const asFloat = new Float32Array(bits.buffer);
		asFloat[0] = 0.003;
		const first = bits[0];
		asFloat[0] = 1;
		const last = bits[0] + 3;
		const patterns = new Uint32Array(Math.ceil((last - first) / 61));
		for (let k = 0; k < patterns.length; k++) patterns[k] = first + 61 * k;
		const values = Float32Array.from([...new Float32Array(patterns.buffer), 0, -0, 1, 0.0031308, -0.25, 1.5, 1e-30, Math.fround(0.0031308) + 1e-9]);
		const reference = Float32Array.from(values, linearToSrgb);
		const same = (a: Float32Array, b: Float32Array) => Buffer.from(a.buffer).equals(Buffer.from(b.buffer));
		expect(same(linearToSrgbArray(values), reference)).toBe(true);
		linearToSrgbArray(values, values);
		expect(same(values, reference)).toBe(true);
	});

	it('linearToSrgbArray rejects non-finite values as linearToSrgb does', () => {
		for (const bad of [NaN, Infinity, -Infinity]) expect(() => linearToSrgbArray(Float32Array.from([0.5, bad]))).toThrow(RangeError);
		expect(() => linearToSrgbArray(Float32Array.from([0.5]), new Float32Array(2))).toThrow(RangeError);
	});
});
