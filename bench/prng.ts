/**
 * Seeded pseudo-random numbers so every benchmark image, kernel and noise field is the same
 * on every run and machine: the engine's own seeded generator (src/lib/imaging/random.ts), with
 * ranges and paired normal draws on top.
 */
import { seededRandom } from '../src/lib/imaging/random';

export class Prng {
	private readonly uniform: () => number;
	private spare: number | null = null;

	constructor(seed: number) {
		this.uniform = seededRandom(seed);
	}

	/** Uniform in [0, 1). */
	next(): number {
		return this.uniform();
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
