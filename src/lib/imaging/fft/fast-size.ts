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
