/**
 * Bessel function of the first kind of order one from Bessel's integral,
 * J1(x) = (1/π) ∫₀^π cos(τ − x·sin τ) dτ (NIST DLMF 10.9.2, https://dlmf.nist.gov/10.9.E2, from memory),
 * by the trapezoidal rule. The integrand extends to a smooth even periodic function, so the rule
 * converges geometrically; its error is of the order of J_{2M−1}(x), negligible once the number of
 * intervals M exceeds |x|/2 by a margin (here M = |x| + 24).
 * @throws RangeError for a non-finite x.
 */
export function besselJ1(x: number): number {
	if (!Number.isFinite(x)) throw new RangeError(`besselJ1 needs a finite argument, got ${x}`);
	const m = Math.ceil(Math.abs(x)) + 24;
	let sum = 0.5 * (Math.cos(0) + Math.cos(Math.PI));
	for (let i = 1; i < m; i++) {
		const tau = (Math.PI * i) / m;
		sum += Math.cos(tau - x * Math.sin(tau));
	}
	return sum / m;
}

const TABLE_STEP = 1 / 128;
const TABLE_END = 256;
let jincTable: Float64Array | undefined;

/**
 * Transfer function of a uniform disk at argument x = 2πRρ: 2·J1(x)/x, 1 at x = 0
 * (M. Cannon, IEEE Trans. ASSP 24(1):58–63, 1976, doi:10.1109/TASSP.1976.1162770). Values for
 * |x| ≤ 256 come from a table at steps of 1/128 with linear interpolation (error at most
 * h²/8·max|f''| = 1.9e-6, as the second derivative is at most 1/4); larger |x| is evaluated directly.
 */
export function jinc(x: number): number {
	const a = Math.abs(x);
	if (a >= TABLE_END) return (2 * besselJ1(a)) / a;
	jincTable ??= Float64Array.from({ length: TABLE_END / TABLE_STEP + 2 }, (_, i) => (i === 0 ? 1 : (2 * besselJ1(i * TABLE_STEP)) / (i * TABLE_STEP)));
	const p = a / TABLE_STEP;
	const i = Math.floor(p);
	return jincTable[i] + (p - i) * (jincTable[i + 1] - jincTable[i]);
}

/**
 * The first `count` positive zeros of J1 (the dark rings of a defocus disk's spectrum are at
 * x = 2πRρ equal to these), found by bisection between sign changes of {@link besselJ1}. The first is
 * 3.8317 (Cannon 1976).
 * @throws RangeError for a count outside [1, 50].
 */
export function besselJ1Zeros(count: number): number[] {
	if (!Number.isInteger(count) || count < 1 || count > 50) throw new RangeError(`count must be an integer in [1, 50], got ${count}`);
	const zeros: number[] = [];
	// Zeros of J1 are about π apart, so a step of 0.25 never straddles two of them.
	for (let a = 0.5; zeros.length < count; a += 0.25) {
		let lo = a;
		let hi = a + 0.25;
		if (Math.sign(besselJ1(lo)) === Math.sign(besselJ1(hi))) continue;
		for (let k = 0; k < 60; k++) {
			const mid = (lo + hi) / 2;
			if (Math.sign(besselJ1(mid)) === Math.sign(besselJ1(lo))) lo = mid;
			else hi = mid;
		}
		zeros.push((lo + hi) / 2);
	}
	return zeros;
}
