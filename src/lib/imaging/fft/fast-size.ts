/** True for 1, 2, 4, 8, … */
export function isPowerOfTwo(n: number): boolean {
	return Number.isInteger(n) && n >= 1 && (n & (n - 1)) === 0;
}

/**
 * Smallest power of two ≥ n.
 * @throws RangeError for n < 1 or n > 2^30.
 */
export function nextPowerOfTwo(n: number): number {
	if (!Number.isFinite(n) || n < 1 || n > 2 ** 30) {
		throw new RangeError(`length must lie in [1, 2^30], got ${n}`);
	}
	let p = 1;
	while (p < n) p *= 2;
	return p;
}

/**
 * Smallest 5-smooth number (2^a·3^b·5^c) ≥ n: the sizes mixed-radix FFTs handle fastest
 * (common practice, no source; scipy.fft.next_fast_len uses the same family).
 * @throws RangeError for n < 1 or n > 2^30.
 */
export function nextSmoothLength(n: number): number {
	if (!Number.isFinite(n) || n < 1 || n > 2 ** 30) {
		throw new RangeError(`length must lie in [1, 2^30], got ${n}`);
	}
	let best = nextPowerOfTwo(n);
	for (let p5 = 1; p5 < best; p5 *= 5) {
		for (let p35 = p5; p35 < best; p35 *= 3) {
			let candidate = p35;
			while (candidate < n) candidate *= 2;
			if (candidate < best) best = candidate;
		}
	}
	return best;
}

/** True when n ≥ 1 has no prime factor other than 2, 3 and 5. */
export function isSmooth(n: number): boolean {
	if (!Number.isInteger(n) || n < 1) return false;
	for (const p of [2, 3, 5]) while (n % p === 0) n /= p;
	return n === 1;
}

/**
 * Smallest 5-smooth multiple of `multiple` (a power of two) that is ≥ n, i.e. multiple·m with m the
 * next 5-smooth number ≥ n / multiple. PFFFT needs complex lengths divisible by 16 with its SIMD
 * build, and the engine's real transforms halve the width, hence multiples of 16 and 32.
 * @throws RangeError for n outside [1, 2^30] or a multiple that is not a power of two.
 */
export function nextSmoothMultiple(n: number, multiple: number): number {
	if (!isPowerOfTwo(multiple)) throw new RangeError(`multiple must be a power of two, got ${multiple}`);
	if (!Number.isFinite(n) || n < 1 || n > 2 ** 30) throw new RangeError(`length must lie in [1, 2^30], got ${n}`);
	return multiple * nextSmoothLength(Math.ceil(n / multiple));
}
