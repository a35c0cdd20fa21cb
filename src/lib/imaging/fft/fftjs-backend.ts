import FFT from 'fft.js';
import { assertComplexShape, type FftBackend } from './backend';
import { isPowerOfTwo, nextPowerOfTwo } from './fast-size';

/**
 * Radix-4 FFT from fft.js 4.0.4 applied along rows and then along columns (columns are gathered
 * into a scratch line). Powers of two ≥ 2 only.
 * @see fft.js 4.0.4 (Fedor Indutny), npm package `fft.js`.
 */
export class FftJsBackend implements FftBackend {
	readonly name = 'fft.js-4.0.4';
	private readonly plans = new Map<number, FFT>();
	private readonly scratch = new Map<number, [Float64Array, Float64Array]>();

	supports(length: number): boolean {
		return isPowerOfTwo(length) && length >= 2;
	}

	fastLength(n: number): number {
		return Math.max(2, nextPowerOfTwo(n));
	}

	fft2(data: Float64Array, rows: number, cols: number, inverse: boolean): void {
		assertComplexShape(data, rows, cols);
		if (!this.supports(rows) || !this.supports(cols)) {
			throw new RangeError(`${this.name} transforms powers of two ≥ 2, got ${rows}×${cols}`);
		}
		const rowPlan = this.plan(cols);
		const [, rowOut] = this.lines(cols);
		for (let i = 0; i < rows; i++) {
			const offset = 2 * i * cols;
			const line = data.subarray(offset, offset + 2 * cols);
			if (inverse) rowPlan.inverseTransform(rowOut, line);
			else rowPlan.transform(rowOut, line);
			data.set(rowOut, offset);
		}
		const colPlan = this.plan(rows);
		const [colIn, colOut] = this.lines(rows);
		const stride = 2 * cols;
		for (let j = 0; j < cols; j++) {
			for (let i = 0, p = 2 * j; i < rows; i++, p += stride) {
				colIn[2 * i] = data[p];
				colIn[2 * i + 1] = data[p + 1];
			}
			if (inverse) colPlan.inverseTransform(colOut, colIn);
			else colPlan.transform(colOut, colIn);
			for (let i = 0, p = 2 * j; i < rows; i++, p += stride) {
				data[p] = colOut[2 * i];
				data[p + 1] = colOut[2 * i + 1];
			}
		}
	}

	private plan(n: number): FFT {
		let plan = this.plans.get(n);
		if (!plan) {
			plan = new FFT(n);
			this.plans.set(n, plan);
		}
		return plan;
	}

	private lines(n: number): [Float64Array, Float64Array] {
		let pair = this.scratch.get(n);
		if (!pair) {
			pair = [new Float64Array(2 * n), new Float64Array(2 * n)];
			this.scratch.set(n, pair);
		}
		return pair;
	}
}
