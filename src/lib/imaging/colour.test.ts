import { describe, expect, it } from 'vitest';
import { linearToSrgb, srgbToLinear, toLinear, toSrgb } from './colour';
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
});
