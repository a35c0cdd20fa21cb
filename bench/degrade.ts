import type { SynthImage } from './image';
import { cropImage } from './image';
import type { SynthKernel } from './kernels';
import { Prng } from './prng';

/**
 * Blur synthesis, independent of the engine under test: plain spatial convolution in double
 * precision. Blur is physical, so it acts in linear light: sRGB decode, convolve, encode
 * (IEC 61966-2-1; Tai et al., TPAMI 2013 on why gamma matters). Noise is added to the encoded
 * values, as sensor and quantisation noise reach the stored file, then samples are clamped and
 * quantised to 16 bits like a stored 16-bit TIFF.
 */
export const srgbToLinear = (c: number) => (c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4);
export const linearToSrgb = (l: number) => (l <= 0.0031308 ? 12.92 * l : 1.055 * l ** (1 / 2.4) - 0.055);

/**
 * 'valid' convolution: only outputs whose whole kernel footprint lies inside the input, so no
 * boundary assumption (circular, zero, mirrored) enters the blurred image.
 */
export function convolveValid(src: Float32Array | Float64Array, width: number, height: number, k: SynthKernel): Float64Array {
	const K = k.size;
	const ow = width - K + 1;
	const oh = height - K + 1;
	if (ow < 1 || oh < 1) throw new RangeError(`image ${width}×${height} is smaller than kernel ${K}×${K}`);
	const taps: [number, number, number][] = [];
	// Convolution flips the kernel: out(y, x) = Σ k(i, j) · in(y + K−1−i, x + K−1−j).
	for (let i = 0; i < K; i++) for (let j = 0; j < K; j++) {
		const w = k.data[i * K + j];
		if (w !== 0) taps.push([K - 1 - i, K - 1 - j, w]);
	}
	const out = new Float64Array(ow * oh);
	for (const [dy, dx, w] of taps) {
		for (let y = 0; y < oh; y++) {
			const row = (y + dy) * width + dx;
			const o = y * ow;
			for (let x = 0; x < ow; x++) out[o + x] += w * src[row + x];
		}
	}
	return out;
}

export interface BenchCase {
	id: string;
	scene: string;
	kernel: SynthKernel;
	noiseSigma: number;
	truth: SynthImage;
	blurred: SynthImage;
}

/**
 * Blur a scene rendered larger than `size`, keep the valid part and crop its centre; the truth
 * is the matching crop of the sharp scene (the kernel's centre pixel maps output to input).
 */
export function degrade(id: string, sceneName: string, sharpImg: SynthImage, kernel: SynthKernel, noiseSigma: number, size: number, seed: number): BenchCase {
	const K = kernel.size;
	const vw = sharpImg.width - K + 1;
	const vh = sharpImg.height - K + 1;
	if (vw < size || vh < size) throw new RangeError(`scene too small for a ${size}px crop with a ${K}px kernel`);
	const ox = Math.floor((vw - size) / 2);
	const oy = Math.floor((vh - size) / 2);
	const half = (K - 1) / 2;
	const truth = cropImage(sharpImg, ox + half, oy + half, size, size);
	const rng = new Prng(seed);
	const planes = sharpImg.planes.map((p) => {
		const linear = Float64Array.from(p, srgbToLinear);
		const blurred = convolveValid(linear, sharpImg.width, sharpImg.height, kernel);
		const out = new Float32Array(size * size);
		for (let y = 0; y < size; y++) {
			for (let x = 0; x < size; x++) {
				const v = linearToSrgb(blurred[(oy + y) * vw + ox + x]) + noiseSigma * rng.normal();
				out[y * size + x] = Math.round(Math.min(1, Math.max(0, v)) * 65535) / 65535;
			}
		}
		return out;
	});
	return { id, scene: sceneName, kernel, noiseSigma, truth, blurred: { width: size, height: size, planes } };
}
