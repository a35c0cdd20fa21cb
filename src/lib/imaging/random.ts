/**
 * Seeded pseudo-random numbers, so a synthetic blur, a shake trajectory or a demo image replays
 * exactly from its seed on any machine.
 */

/** Uniform numbers in [0, 1) from a 32-bit seed (mulberry32, common practice, no source). */
export function seededRandom(seed: number): () => number {
	let a = seed >>> 0;
	return () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

/** Standard normal samples by the Box–Muller transform (Box & Muller, Ann. Math. Stat. 29(2), 1958). */
export function seededGaussian(seed: number): () => number {
	const u = seededRandom(seed);
	return () => Math.sqrt(-2 * Math.log(1 - u())) * Math.cos(2 * Math.PI * u());
}
