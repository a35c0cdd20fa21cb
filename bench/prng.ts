/**
 * Seeded pseudo-random numbers so every benchmark image, kernel and noise field is the same
 * on every run and machine. mulberry32 (Tommy Ettinger, public domain; from memory): 32-bit
 * state, period 2^32, plenty for a few million draws per image.
 */
export class Prng {
	private state: number;
	private spare: number | null = null;

	constructor(seed: number) {
		this.state = seed >>> 0;
	}

	/** Uniform in [0, 1). */
	next(): number {
		this.state = (this.state + 0x6d2b79f5) >>> 0;
		let t = this.state;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	}

	/** Uniform in [lo, hi). */
	between(lo: number, hi: number): number {
		return lo + (hi - lo) * this.next();
	}

	/** Standard normal draw by the Box–Muller transform (Box & Muller, Ann. Math. Stat. 29, 1958). */
	normal(): number {
		if (this.spare !== null) {
			const s = this.spare;
			this.spare = null;
			return s;
		}
		let u = 0;
		while (u === 0) u = this.next();
		const v = this.next();
		const r = Math.sqrt(-2 * Math.log(u));
		this.spare = r * Math.sin(2 * Math.PI * v);
		return r * Math.cos(2 * Math.PI * v);
	}
}
