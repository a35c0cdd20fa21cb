import { describe, expect, it } from 'vitest';
import { radialMean, sectorMeans } from './radial-profile';

const N = 64;
function map(f: (dx: number, dy: number) => number): Float64Array {
	const out = new Float64Array(N * N);
	for (let y = 0; y < N; y++) for (let x = 0; x < N; x++) out[y * N + x] = f(x - N / 2, y - N / 2);
	return out;
}

describe('sectorMeans', () => {
	it('with one sector is the ring mean', () => {
		const values = map((dx, dy) => Math.cos(dx / 3) + dy * dy);
		expect(Array.from(sectorMeans(values, N, 30, 1)[0])).toEqual(Array.from(radialMean(values, N, 30)));
	});

	it('keeps directions apart and folds opposite directions together (P(−ω) = P(ω) for a real image)', () => {
		// 1 within 30° of the horizontal axis, on both sides of the centre; 0 elsewhere.
		const values = map((dx, dy) => (Math.abs(dy) < Math.tan(Math.PI / 6) * Math.abs(dx) ? 1 : 0));
		const [first, second, third, fourth, fifth, sixth] = sectorMeans(values, N, 30, 6);
		for (let r = 5; r <= 30; r++) {
			expect(first[r]).toBe(1);
			expect(sixth[r]).toBe(1);
			for (const s of [second, third, fourth, fifth]) expect(s[r]).toBe(0);
		}
	});

	it('rejects a sector count that is not a positive integer', () => {
		expect(() => sectorMeans(new Float64Array(N * N), N, 30, 0)).toThrow(RangeError);
		expect(() => sectorMeans(new Float64Array(N * N), N, 30, 2.5)).toThrow(RangeError);
	});
});
