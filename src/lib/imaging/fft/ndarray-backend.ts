import ndarray from 'ndarray';
import ndfft from 'ndarray-fft';
import { assertComplexShape, type FftBackend } from './backend';
import { nextSmoothLength } from './fast-size';

/**
 * The reference oracle: ndarray-fft 1.0.3 (radix-2 for powers of two, Bluestein otherwise), so any
 * length is supported. Slower than the fast backend; used for odd sizes and as the test reference.
 * @see ndarray-fft 1.0.3 (Mikola Lysenko), npm package `ndarray-fft`.
 */
export class NdarrayFftBackend implements FftBackend {
	readonly name = 'ndarray-fft-1.0.3';

	supports(length: number): boolean {
		return Number.isInteger(length) && length >= 1;
	}

	fastLength(n: number): number {
		return nextSmoothLength(n);
	}

	fft2(data: Float64Array, rows: number, cols: number, inverse: boolean): void {
		assertComplexShape(data, rows, cols);
		const n = rows * cols;
		const re = new Float64Array(n);
		const im = new Float64Array(n);
		for (let i = 0; i < n; i++) {
			re[i] = data[2 * i];
			im[i] = data[2 * i + 1];
		}
		// ndarray-fft 1.0.3 (measured, lib/fft-matrix.js): dir −1 uses e^{−2πi…} and scales by 1/N,
		// dir +1 uses e^{+2πi…} unscaled; rescale to the engine's convention.
		ndfft(inverse ? 1 : -1, ndarray(re, [rows, cols]), ndarray(im, [rows, cols]));
		const scale = inverse ? 1 / n : n;
		for (let i = 0; i < n; i++) {
			data[2 * i] = re[i] * scale;
			data[2 * i + 1] = im[i] * scale;
		}
	}
}
