import { describe, expect, it } from 'vitest';
import { dipCount, dipShare } from './dips';

/** Samples p(r) for r = first … last. */
const sampled = (first: number, last: number, p: (r: number) => number) => Float64Array.from({ length: last - first + 1 }, (_, i) => p(first + i));

describe('dipCount', () => {
	// A power-law fall-off in log power, −2·ln r, is convex in r: the mean of two samples exceeds any
	// sample between them when the zero sits near the outer one (Jensen's inequality).
	const fallOff = sampled(3, 115, (r) => -2 * Math.log(r));
	const zeros = [70, 129, 187];

	it("counts a convex fall-off as a dip under rule 'mean' but not under rule 'both'", () => {
		expect(dipCount(fallOff, 3, zeros, 1, 'mean')).toEqual({ passed: 1, tested: 1 });
		expect(dipCount(fallOff, 3, zeros, 1, 'both')).toEqual({ passed: 0, tested: 1 });
	});

	it('counts a real dip under both rules, and only when it is deeper than the margin', () => {
		const ring = (depth: number) => sampled(3, 115, (r) => -depth * Math.exp(-(((r - 70) / 3) ** 2)));
		expect(dipCount(ring(1), 3, zeros, 1, 'both', 0.8).passed).toBe(1);
		expect(dipCount(ring(1), 3, zeros, 1, 'mean', 0.8).passed).toBe(1);
		expect(dipCount(ring(0.5), 3, zeros, 1, 'both', 0.8).passed).toBe(0);
	});

	it('agrees with dipShare, which caps a single tested zero at one half', () => {
		const ring = sampled(3, 115, (r) => -Math.exp(-(((r - 70) / 3) ** 2)));
		const { passed, tested } = dipCount(ring, 3, zeros);
		expect(tested).toBe(1);
		expect(dipShare(ring, 3, zeros)).toBe(passed / 2);
	});
});
