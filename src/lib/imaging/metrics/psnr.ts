import { planeValues, type Plane } from '../types';

/**
 * Peak signal-to-noise ratio, PSNR = 10·log₁₀(peak² / MSE) dB; Infinity for identical planes.
 * @see Z. Wang, A. C. Bovik, "Mean squared error: Love it or leave it?", IEEE Signal Processing
 *   Magazine 26(1):98–117, 2009, doi:10.1109/MSP.2008.930649.
 * @param peak largest possible value. @default 1
 * @throws RangeError for differing shapes or a non-positive peak.
 */
export function psnr(a: Plane, b: Plane, peak = 1): number {
	if (a.shape[0] !== b.shape[0] || a.shape[1] !== b.shape[1]) {
		throw new RangeError(`planes differ in shape: ${a.shape.join('×')} vs ${b.shape.join('×')}`);
	}
	if (!(peak > 0)) throw new RangeError(`peak must be positive, got ${peak}`);
	const x = planeValues(a);
	const y = planeValues(b);
	let sum = 0;
	for (let i = 0; i < x.length; i++) {
		const d = x[i] - y[i];
		sum += d * d;
	}
	const mse = sum / x.length;
	return mse === 0 ? Infinity : 10 * Math.log10((peak * peak) / mse);
}
