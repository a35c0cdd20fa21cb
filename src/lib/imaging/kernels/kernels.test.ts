import { describe, expect, it } from 'vitest';
import { createPlane } from '../types';
import { buildKernel } from './build';
import { kernelFromImage } from './explicit';
import { kernelCentroid } from './raster';
import { randomShakePath } from './shake';
import { kernelSpecSchema, type KernelSpec } from './spec';
import { kernelFromStreak } from './streak';

function sum(p: { data: Float32Array }): number {
	let s = 0;
	for (const v of p.data) s += v;
	return s;
}

const specs: KernelSpec[] = [
	...[0, 17, 30, 45, 90, 135, 200, 333].map((angleDeg) => ({ kind: 'line' as const, length: 12.5, angleDeg })),
	{ kind: 'line', length: 7, angleDeg: 0 },
	{ kind: 'line', length: 0.4, angleDeg: 10 },
	{ kind: 'path', points: [[10, 10], [20, 12], [22, 30]], weights: [1, 3] },
	{ kind: 'path', points: [[0, 0], [5, 8], [9, 2], [14, 7]], smooth: true },
	{ kind: 'path', points: [[3, 3]] },
	randomShakePath(42, { length: 20 }),
	{ kind: 'disk', radius: 0.7 },
	{ kind: 'disk', radius: 6.3 },
	{ kind: 'gaussian', sigma: 0.4 },
	{ kind: 'gaussian', sigma: 2.2 }
];

describe('buildKernel', () => {
	for (const spec of specs) {
		it(`${spec.kind} ${JSON.stringify(spec).slice(0, 60)}: odd-sized, sums to 1, centroid at the centre pixel`, () => {
			const k = buildKernel(spec);
			const [h, w] = k.shape;
			expect(h % 2).toBe(1);
			expect(w % 2).toBe(1);
			// A PSF conserves flux: Σ k = 1 (Richardson 1972), to Float32 rounding.
			expect(sum(k)).toBeCloseTo(1, 5);
			for (const v of k.data) expect(v).toBeGreaterThanOrEqual(0);
			// Centring keeps the restored image in place (common practice, no source); Float32 storage limits it to ~1e-5 px.
			const c = kernelCentroid(k);
			expect(Math.abs(c.x)).toBeLessThan(1e-4);
			expect(Math.abs(c.y)).toBeLessThan(1e-4);
		});
	}

	it('line angle is counter-clockwise on screen: 45° runs from bottom-left to top-right', () => {
		// Issue 3 convention: angle CCW from +x as seen on screen, image rows grow downwards.
		const k = buildKernel({ kind: 'line', length: 9, angleDeg: 45 });
		const [h, w] = k.shape;
		const c = (h - 1) / 2;
		const up = k.get(c - 3, c + 3);
		const down = k.get(c + 3, c + 3);
		expect(up).toBeGreaterThan(0.05);
		expect(down).toBe(0);
		expect(w).toBe(h);
		const vertical = buildKernel({ kind: 'line', length: 9, angleDeg: 90 });
		expect(vertical.shape[1]).toBe(1);
		expect(vertical.shape[0]).toBe(9);
	});

	it('an axis-aligned odd integer line is the exact box of L taps (Gonzalez & Woods §5.6)', () => {
		const k = buildKernel({ kind: 'line', length: 7, angleDeg: 0 });
		expect(k.shape).toEqual([1, 7]);
		for (const v of k.data) expect(v).toBeCloseTo(1 / 7, 7);
	});

	it('path dwell weights move energy to the heavier segment', () => {
		// An L-shaped path: horizontal run then vertical run at x = 10. With exposure share p on the
		// vertical run, var(x) = (1 − p)·100/3 + 100p − (5(1 − p) + 10p)²: 10.4 px² for p = ½, 5.67 px² for p = 0.8
		// (uniform distribution moments, common practice, no source); bilinear splats add 1/6 px² at most.
		const varianceX = (weights: number[]) => {
			const k = buildKernel({ kind: 'path', points: [[0, 0], [10, 0], [10, 10]], weights });
			const [h, w] = k.shape;
			let m = 0;
			let m2 = 0;
			for (let i = 0; i < h; i++) {
				for (let j = 0; j < w; j++) {
					m += k.get(i, j) * j;
					m2 += k.get(i, j) * j * j;
				}
			}
			return m2 - m * m;
		};
		expect(Math.abs(varianceX([1, 1]) - 10.42)).toBeLessThan(0.3);
		expect(Math.abs(varianceX([1, 4]) - 5.67)).toBeLessThan(0.3);
	});

	it('is deterministic and the spec survives a JSON round trip', () => {
		for (const spec of specs) {
			const again = JSON.parse(JSON.stringify(spec)) as KernelSpec;
			expect(kernelSpecSchema.parse(again)).toEqual(spec);
			expect(Array.from(buildKernel(again).data)).toEqual(Array.from(buildKernel(spec).data));
		}
	});

	it('guards arguments with RangeError', () => {
		expect(() => buildKernel({ kind: 'line', length: 0, angleDeg: 0 })).toThrow(RangeError);
		expect(() => buildKernel({ kind: 'disk', radius: 300 })).toThrow(RangeError);
		expect(() => buildKernel({ kind: 'gaussian', sigma: -1 })).toThrow(RangeError);
		expect(() => buildKernel({ kind: 'path', points: [[0, 0], [1, 1]], weights: [1, 2] })).toThrow(RangeError);
		expect(() => buildKernel({ kind: 'image', width: 2, height: 1, data: [0, 0] })).toThrow(RangeError);
		expect(() => buildKernel({ kind: 'image', width: 2, height: 1, data: [1, -1] })).toThrow(RangeError);
	});
});

describe('kernelSpecSchema (zod 4)', () => {
	const message = (value: unknown) => {
		const r = kernelSpecSchema.safeParse(value);
		expect(r.success).toBe(false);
		return r.success ? '' : r.error.issues.map((i) => i.message).join('; ');
	};
	it('rejects bad specs with messages that name the field and the limit', () => {
		expect(message({ kind: 'line', length: 600, angleDeg: 0 })).toContain('at most 512');
		expect(message({ kind: 'line', length: Infinity, angleDeg: 0 })).toContain('line length');
		expect(message({ kind: 'disk', radius: -2 })).toContain('disk radius must be positive');
		expect(message({ kind: 'gaussian', sigma: 200 })).toContain('at most 128');
		expect(message({ kind: 'path', points: [] })).toContain('at least one point');
		expect(message({ kind: 'path', points: Array.from({ length: 2001 }, () => [0, 0]) })).toContain('at most 2000');
		expect(message({ kind: 'path', points: [[0, 0], [1, 0]], weights: [1, 1] })).toContain('one value per segment');
		expect(message({ kind: 'image', width: 300, height: 1, data: [] })).toContain('at most 257');
		expect(message({ kind: 'image', width: 2, height: 1, data: [1] })).toContain('width·height');
		expect(message({ kind: 'image', width: 2, height: 1, data: [0, 0] })).toContain('positive sum');
		expect(message({ kind: 'image', width: 1, height: 1, data: [-1] })).toContain('non-negative');
		expect(message({ kind: 'blob' })).toContain('kernel kind must be one of');
		expect(message({ kind: 'disk', radius: 2, extra: 1 })).not.toBe('');
	});
});

describe('explicit kernels', () => {
	it('kernelFromImage crops, centres on the centroid (to the nearest pixel) and normalises', () => {
		const plane = createPlane(9, 12);
		plane.set(2, 8, 3);
		plane.set(2, 9, 1);
		plane.set(3, 8, 1);
		const spec = kernelFromImage(plane);
		expect(spec.origin).toBe('upload');
		expect(spec.width % 2).toBe(1);
		expect(spec.height % 2).toBe(1);
		expect(spec.data.reduce((a, b) => a + b, 0)).toBeCloseTo(1, 6);
		const c = kernelCentroid(buildKernel(spec));
		expect(Math.abs(c.x)).toBeLessThanOrEqual(0.5);
		expect(Math.abs(c.y)).toBeLessThanOrEqual(0.5);
		expect(kernelSpecSchema.safeParse(spec).success).toBe(true);
	});

	it('kernelFromStreak removes the background and keeps the streak', () => {
		const plane = createPlane(40, 40);
		for (let i = 0; i < plane.data.length; i++) plane.data[i] = 0.1 + 0.001 * ((i * 7919) % 13);
		for (let j = 15; j < 25; j++) plane.set(20, j, 0.9);
		const spec = kernelFromStreak(plane, { x: 10, y: 10, width: 20, height: 20 });
		expect(spec.origin).toBe('streak');
		expect(spec.height).toBe(1);
		expect(spec.width).toBeGreaterThanOrEqual(9);
		expect(() => kernelFromStreak(plane, { x: 30, y: 30, width: 20, height: 20 })).toThrow(RangeError);
		const flat = createPlane(10, 10);
		flat.data.fill(0.2);
		expect(() => kernelFromStreak(flat, { x: 0, y: 0, width: 10, height: 10 })).toThrow(RangeError);
	});
});
