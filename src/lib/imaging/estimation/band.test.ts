import { describe, expect, it } from 'vitest';
import { analysisBand } from './band';

const N = 128;

/** A centred map whose ring mean is `ring(r)`. */
function radialMap(ring: (r: number) => number): Float64Array {
	const out = new Float64Array(N * N);
	for (let y = 0; y < N; y++) for (let x = 0; x < N; x++) out[y * N + x] = ring(Math.hypot(x - N / 2, y - N / 2));
	return out;
}

describe('analysisBand', () => {
	// Power 100 σ² falling to the floor at r = 20 … 24 (a dark ring), back to 10 σ² beyond, and under
	// the floor from r = 40 on.
	const sigma = 0.1;
	const power = radialMap((r) => sigma * sigma * (r < 20 ? 100 : r < 25 ? 1 : r < 40 ? 10 : 0.5));

	it("ends before the first ring under the floor by default (edge 'first')", () => {
		// Ring means split each sample between its two nearest rings, so ring 20 still holds samples from r < 20.
		const band = analysisBand(power, N, sigma);
		expect(band.rMin).toBe(3);
		expect(band.rMax).toBeGreaterThanOrEqual(19);
		expect(band.rMax).toBeLessThanOrEqual(20);
	});

	it("keeps a ring that dips into the noise, with its brighter lobe beyond, with edge 'last'", () => {
		const band = analysisBand(power, N, sigma, { edge: 'last' });
		expect(band.rMin).toBe(3);
		expect(band.rMax).toBeGreaterThanOrEqual(39);
		expect(band.rMax).toBeLessThanOrEqual(40);
	});
});
