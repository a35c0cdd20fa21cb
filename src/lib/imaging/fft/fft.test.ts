import FFT from 'fft.js';
import ndarray from 'ndarray';
import { describe, expect, it } from 'vitest';
import { seededRandom } from '../testing/fixtures';
import { DefaultFftBackend } from './default-backend';
import { nextPowerOfTwo, nextSmoothLength } from './fast-size';
import { FftJsBackend } from './fftjs-backend';
import { NdarrayFftBackend } from './ndarray-backend';
import { irfft2, rfft2, rfft2Buffer } from './real-fft';

/** Textbook 2-D DFT, X[k,l] = Σ x[n,m]·e^{−2πi(kn/N + lm/M)} (Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §8.5). */
function naiveDft(data: Float64Array, rows: number, cols: number): Float64Array {
	const out = new Float64Array(data.length);
	for (let k = 0; k < rows; k++) {
		for (let l = 0; l < cols; l++) {
			let re = 0;
			let im = 0;
			for (let n = 0; n < rows; n++) {
				for (let m = 0; m < cols; m++) {
					const a = -2 * Math.PI * ((k * n) / rows + (l * m) / cols);
					const xr = data[2 * (n * cols + m)];
					const xi = data[2 * (n * cols + m) + 1];
					re += xr * Math.cos(a) - xi * Math.sin(a);
					im += xr * Math.sin(a) + xi * Math.cos(a);
				}
			}
			out[2 * (k * cols + l)] = re;
			out[2 * (k * cols + l) + 1] = im;
		}
	}
	return out;
}

function randomComplex(n: number, seed: number): Float64Array {
	const r = seededRandom(seed);
	return Float64Array.from({ length: 2 * n }, () => r() - 0.5);
}

function maxAbsDiff(a: ArrayLike<number>, b: ArrayLike<number>): number {
	let m = 0;
	for (let i = 0; i < a.length; i++) m = Math.max(m, Math.abs(a[i] - b[i]));
	return m;
}

/** Stated tolerance of the FFT layer: 1e-9 absolute on unit-scale data of ≤ 64×64 (double precision, common practice, no source). */
const TOLERANCE = 1e-9;

describe('FFT backends', () => {
	const backends = [new FftJsBackend(), new NdarrayFftBackend(), new DefaultFftBackend()];

	for (const backend of backends) {
		it(`${backend.name} matches a naive DFT on 8×16 and inverts it`, () => {
			const x = randomComplex(8 * 16, 1);
			const y = x.slice();
			backend.fft2(y, 8, 16, false);
			expect(maxAbsDiff(y, naiveDft(x, 8, 16))).toBeLessThan(TOLERANCE);
			backend.fft2(y, 8, 16, true);
			expect(maxAbsDiff(y, x)).toBeLessThan(TOLERANCE);
		});
	}

	it('the reference (ndarray-fft 1.0.3) and the default backend handle non-power-of-two sizes like a naive DFT', () => {
		for (const backend of [new NdarrayFftBackend(), new DefaultFftBackend()]) {
			const x = randomComplex(6 * 10, 2);
			const y = x.slice();
			backend.fft2(y, 6, 10, false);
			expect(maxAbsDiff(y, naiveDft(x, 6, 10))).toBeLessThan(TOLERANCE);
		}
	});

	it('fft.js backend agrees with the ndarray-fft oracle on 64×32 (stated tolerance 1e-9)', () => {
		const x = randomComplex(64 * 32, 3);
		const a = x.slice();
		const b = x.slice();
		new FftJsBackend().fft2(a, 64, 32, false);
		new NdarrayFftBackend().fft2(b, 64, 32, false);
		expect(maxAbsDiff(a, b)).toBeLessThan(TOLERANCE);
	});

	it('both backends agree with a direct fft.js 4.0.4 1-D transform (fft.js reference)', () => {
		// A 2×16 array whose second row is zero: both rows of its 2-D DFT equal the 1-D DFT of the first row.
		const x = randomComplex(16, 4);
		const direct = new Float64Array(32);
		new FFT(16).transform(direct, x);
		for (const backend of [new FftJsBackend(), new NdarrayFftBackend()]) {
			const two = new Float64Array(64);
			two.set(x);
			backend.fft2(two, 2, 16, false);
			expect(maxAbsDiff(two.subarray(0, 32), direct)).toBeLessThan(TOLERANCE);
			expect(maxAbsDiff(two.subarray(32, 64), direct)).toBeLessThan(TOLERANCE);
		}
	});

	it('satisfies Parseval: Σ|x|² = Σ|X|² / (N·M) (Oppenheim & Schafer §8.6.7)', () => {
		const x = randomComplex(32 * 16, 5);
		let energy = 0;
		for (const v of x) energy += v * v;
		const y = x.slice();
		new DefaultFftBackend().fft2(y, 32, 16, false);
		let spectral = 0;
		for (const v of y) spectral += v * v;
		expect(spectral / (32 * 16)).toBeCloseTo(energy, 9);
	});

	it('rejects sizes a backend cannot transform and mismatched buffers with RangeError', () => {
		expect(() => new FftJsBackend().fft2(new Float64Array(2 * 12), 3, 4, false)).toThrow(RangeError);
		expect(() => new NdarrayFftBackend().fft2(new Float64Array(10), 2, 4, false)).toThrow(RangeError);
	});
});

describe('real-to-complex layer', () => {
	for (const [rows, cols] of [
		[8, 16],
		[6, 10],
		[5, 7],
		[16, 2]
	] as const) {
		it(`rfft2 equals the first ⌊M/2⌋+1 columns of the complex DFT and irfft2 inverts it (${rows}×${cols})`, () => {
			const r = seededRandom(rows * 31 + cols);
			const real = Float64Array.from({ length: rows * cols }, () => r());
			const complex = new Float64Array(2 * rows * cols);
			for (let i = 0; i < real.length; i++) complex[2 * i] = real[i];
			const full = naiveDft(complex, rows, cols);
			const half = rfft2(ndarray(real, [rows, cols]));
			expect(half.halfCols).toBe(Math.floor(cols / 2) + 1);
			for (let k = 0; k < rows; k++) {
				for (let l = 0; l < half.halfCols; l++) {
					expect(Math.abs(half.data[2 * (k * half.halfCols + l)] - full[2 * (k * cols + l)])).toBeLessThan(TOLERANCE);
					expect(Math.abs(half.data[2 * (k * half.halfCols + l) + 1] - full[2 * (k * cols + l) + 1])).toBeLessThan(TOLERANCE);
				}
			}
			expect(maxAbsDiff(irfft2(half), real)).toBeLessThan(TOLERANCE);
		});
	}

	it('zero-pads a smaller array to the requested size', () => {
		const small = ndarray(Float64Array.from([1, 2, 3, 4]), [2, 2]);
		const padded = rfft2(small, [4, 4]);
		expect(padded.data[0]).toBeCloseTo(10, 12);
		expect(() => rfft2(small, [1, 4])).toThrow(RangeError);
		expect(() => rfft2Buffer(new Float64Array(3), 2, 2)).toThrow(RangeError);
	});
});

describe('fast sizes', () => {
	it('finds the next power of two and the next 5-smooth length', () => {
		expect(nextPowerOfTwo(1)).toBe(1);
		expect(nextPowerOfTwo(1025)).toBe(2048);
		expect(nextSmoothLength(4033)).toBe(4050);
		expect(nextSmoothLength(97)).toBe(100);
		expect(() => nextPowerOfTwo(0)).toThrow(RangeError);
	});
});
