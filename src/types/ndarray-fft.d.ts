declare module 'ndarray-fft' {
	import type { NdArray } from 'ndarray';
	/**
	 * In-place complex FFT over every axis. `dir` picks the exponent's sign and the scaling; in
	 * 1.0.3, −1 carries the 1/N factor. src/lib/imaging/fft/ndarray-backend.ts maps it to the
	 * engine's convention and its tests check the mapping against a naive DFT.
	 */
	export default function fft(dir: 1 | -1, real: NdArray, imag: NdArray): void;
}
