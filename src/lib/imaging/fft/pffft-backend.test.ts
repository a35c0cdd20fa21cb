import FFT from 'fft.js';
import { beforeAll, describe, expect, it } from 'vitest';
import { seededRandom } from '../testing/fixtures';
import { isSmooth, nextSmoothMultiple } from './fast-size';
import { FftJsBackend } from './fftjs-backend';
import { NdarrayFftBackend } from './ndarray-backend';
import type { PffftBackend } from './pffft-backend';
import { loadPffftBackend } from './pffft-loader';
import { irfft2, rfft2Buffer } from './real-fft';

function randomComplex(n: number, seed: number): Float64Array {
	const r = seededRandom(seed);
	return Float64Array.from({ length: 2 * n }, () => r() - 0.5);
}

/** Largest |a − b| relative to the largest |b| (the usual norm-wise FFT error measure). */
function relativeError(a: ArrayLike<number>, b: ArrayLike<number>): number {
	let diff = 0;
	let scale = 0;
	for (let i = 0; i < a.length; i++) {
		diff = Math.max(diff, Math.abs(a[i] - b[i]));
		scale = Math.max(scale, Math.abs(b[i]));
	}
	return diff / scale;
}

/**
 * Stated tolerance of the float32 PFFFT backend: 2e-6 of the spectrum's largest magnitude. Single
 * precision carries ε = 6e-8; a Cooley–Tukey FFT's error grows like ε·log₂N (Gentleman & Sande,
 * AFIPS 1966, doi:10.1145/1464291.1464352), ≈ 1.4e-6 for N = 2^24 even in the worst case; measured
 * on these sizes (Node 20, x86-64): ≤ 3.7e-7 forward, ≤ 8.9e-7 after the round trip.
 */
const TOLERANCE = 2e-6;

describe('PFFFT backend (WASM SIMD, float32)', () => {
	let pffft: PffftBackend;
	const oracle = new NdarrayFftBackend();
	beforeAll(async () => {
		pffft = await loadPffftBackend();
	});

	const sizes: [number, number][] = [[16, 16], [32, 48], [48, 80], [96, 160], [144, 240], [256, 256], [240, 320], [400, 480]];
	for (const [rows, cols] of sizes) {
		it(`matches the ndarray-fft 1.0.3 oracle on ${rows}×${cols} (2^a·3^b·5^c) and inverts it`, () => {
			expect(pffft.native(rows) && pffft.native(cols)).toBe(true);
			const x = randomComplex(rows * cols, rows + cols);
			const expected = x.slice();
			oracle.fft2(expected, rows, cols, false);
			const y = x.slice();
			pffft.fft2(y, rows, cols, false);
			expect(relativeError(y, expected)).toBeLessThan(TOLERANCE);
			pffft.fft2(y, rows, cols, true);
			expect(relativeError(y, x)).toBeLessThan(TOLERANCE);
		});
	}

	it('matches fft.js 4.0.4 on power-of-two sizes, 1-D rows checked directly', () => {
		const x = randomComplex(64 * 128, 7);
		const y = x.slice();
		pffft.fft2(y, 64, 128, false);
		const z = x.slice();
		new FftJsBackend().fft2(z, 64, 128, false);
		expect(relativeError(y, z)).toBeLessThan(TOLERANCE);
		const line = randomComplex(512, 8);
		const expected = new Float64Array(1024);
		new FFT(512).transform(expected, line);
		const ours = new Float64Array(2 * 16 * 512);
		ours.set(line);
		// A 16×512 array with one non-zero row: its 2-D DFT repeats the row's 1-D DFT on every row.
		pffft.fft2(ours, 16, 512, false);
		expect(relativeError(ours.subarray(15 * 1024), expected)).toBeLessThan(TOLERANCE);
	});

	it('falls back to the Float64 backends (odd, prime, too short) and agrees with the oracle to 1e-9', () => {
		for (const [rows, cols] of [[7, 9], [13, 16], [8, 8], [30, 50]] as [number, number][]) {
			expect(pffft.native(rows) && pffft.native(cols)).toBe(false);
			const x = randomComplex(rows * cols, rows * cols);
			const y = x.slice();
			const z = x.slice();
			pffft.fft2(y, rows, cols, false);
			oracle.fft2(z, rows, cols, false);
			expect(relativeError(y, z)).toBeLessThan(1e-9);
		}
	});

	it("obeys Parseval's theorem, Σ|x|² = Σ|X|² / N, to 1e-6 (float32)", () => {
		const [rows, cols] = [192, 320];
		const x = randomComplex(rows * cols, 11);
		const y = x.slice();
		pffft.fft2(y, rows, cols, false);
		let space = 0;
		let freq = 0;
		for (let i = 0; i < x.length; i++) {
			space += x[i] * x[i];
			freq += y[i] * y[i];
		}
		expect(Math.abs(freq / (rows * cols) - space) / space).toBeLessThan(1e-6);
	});

	it('real transforms through it match the oracle and round-trip (rfft2 / irfft2)', () => {
		const [rows, cols] = [96, 160];
		const r = seededRandom(12);
		const real = Float64Array.from({ length: rows * cols }, () => r());
		const ours = rfft2Buffer(real, rows, cols, pffft);
		const reference = rfft2Buffer(real, rows, cols, oracle);
		expect(relativeError(ours.data, reference.data)).toBeLessThan(TOLERANCE);
		expect(relativeError(irfft2(ours, pffft), real)).toBeLessThan(TOLERANCE);
	});

	it('gives identical bits on repeated calls and from a second instance', async () => {
		const x = randomComplex(128 * 96, 13);
		const first = x.slice();
		const again = x.slice();
		pffft.fft2(first, 128, 96, false);
		pffft.fft2(again, 128, 96, false);
		const other = x.slice();
		(await loadPffftBackend()).fft2(other, 128, 96, false);
		expect(Buffer.from(again.buffer).equals(Buffer.from(first.buffer))).toBe(true);
		expect(Buffer.from(other.buffer).equals(Buffer.from(first.buffer))).toBe(true);
	});

	it('names the package and build and the fallback for the run record', () => {
		expect(pffft.name).toBe('pffft-wasm-0.4.2-simd, else fft.js-4.0.4+ndarray-fft-1.0.3');
	});
});

describe('fast sizes', () => {
	it('isSmooth accepts exactly the 2^a·3^b·5^c numbers (checked by trial division)', () => {
		const bySieve = (n: number) => {
			for (let p = 7; p <= n; p++) if (n % p === 0 && [2, 3, 5].every((q) => p % q !== 0)) return false;
			return true;
		};
		for (let n = 1; n <= 500; n++) expect(isSmooth(n)).toBe(bySieve(n));
		expect(isSmooth(0)).toBe(false);
	});

	it('nextSmoothMultiple gives the smallest smooth multiple (scipy.fft.next_fast_len-style table)', () => {
		expect(nextSmoothMultiple(512 + 66, 32)).toBe(640);
		expect(nextSmoothMultiple(3000 + 66, 32)).toBe(3072);
		expect(nextSmoothMultiple(4000 + 66, 32)).toBe(4096);
		expect(nextSmoothMultiple(6000 + 66, 32)).toBe(6144);
		for (let n = 1; n <= 700; n++) {
			const m = nextSmoothMultiple(n, 32);
			expect(m % 32 === 0 && isSmooth(m) && m >= n).toBe(true);
			for (let smaller = m - 32; smaller >= n; smaller -= 32) expect(isSmooth(smaller)).toBe(false);
		}
		expect(() => nextSmoothMultiple(10, 24)).toThrow(RangeError);
		expect(() => nextSmoothMultiple(0, 32)).toThrow(RangeError);
	});
});
