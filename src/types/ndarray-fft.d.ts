declare module 'ndarray-fft' {
	import type { NdArray } from 'ndarray';
	/** In-place complex FFT over every axis: dir 1 forward, −1 inverse (inverse is scaled by 1/N). */
	export default function fft(dir: 1 | -1, real: NdArray, imag: NdArray): void;
}
