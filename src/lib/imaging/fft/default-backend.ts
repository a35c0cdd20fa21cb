import { assertComplexShape, type FftBackend } from './backend';
import { FftJsBackend } from './fftjs-backend';
import { NdarrayFftBackend } from './ndarray-backend';

/**
 * The engine's default: fft.js for power-of-two sizes (what the engine pads to), the ndarray-fft
 * oracle for any other size. Chosen by the micro-benchmark in README.md (fft.js is faster for
 * every power-of-two size measured).
 */
export class DefaultFftBackend implements FftBackend {
	readonly name = 'fft.js-4.0.4+ndarray-fft-1.0.3';
	private readonly fast = new FftJsBackend();
	private readonly reference = new NdarrayFftBackend();

	supports(length: number): boolean {
		return this.reference.supports(length);
	}

	fastLength(n: number): number {
		return this.fast.fastLength(n);
	}

	fft2(data: Float64Array, rows: number, cols: number, inverse: boolean): void {
		assertComplexShape(data, rows, cols);
		if (this.fast.supports(rows) && this.fast.supports(cols)) this.fast.fft2(data, rows, cols, inverse);
		else this.reference.fft2(data, rows, cols, inverse);
	}
}

let shared: FftBackend | undefined;

/** Process-wide default backend (plans and scratch lines are cached inside it). */
export function defaultFftBackend(): FftBackend {
	shared ??= new DefaultFftBackend();
	return shared;
}

/**
 * Make `backend` the default for calls that pass none (e.g. a Node entry point installs the PFFFT
 * backend with its thread pool once at start-up). Its name goes into every run record, so results
 * stay replayable; `undefined` restores the built-in default.
 */
export function setDefaultFftBackend(backend: FftBackend | undefined): void {
	shared = backend;
}
