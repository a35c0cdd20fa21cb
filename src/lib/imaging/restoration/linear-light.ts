import { srgbToLinear } from '../colour';
import type { BlockParallelism } from '../fft/parallel';
import { createPlane, planeValues, type Plane, type RasterImage } from '../types';

/** Every 16-bit code (8-bit codes n/255 are the 16-bit codes 257n/65535, the same real numbers). */
const CODES = 65535;
let tables: { codes: Float32Array; linear: Float64Array } | undefined;

/**
 * The float32 value of every code c/65535 (256 KiB), and srgbToLinear of it (512 KiB), computed once.
 * Comparing with the stored float32 avoids a division per pixel.
 */
function decodeTables(): { codes: Float32Array; linear: Float64Array } {
	if (tables) return tables;
	const codes = new Float32Array(CODES + 1);
	const linear = new Float64Array(CODES + 1);
	for (let c = 0; c <= CODES; c++) {
		codes[c] = c / CODES;
		linear[c] = srgbToLinear(codes[c]);
	}
	return (tables = { codes, linear });
}

/**
 * sRGB → linear light for one plane, bit-identical to mapping {@link srgbToLinear} over it
 * (IEC 61966-2-1:1999, §5.2), but a decoded photograph's values are 8- or 16-bit codes: a value
 * that is exactly the float32 of c/65535 is looked up in a table of srgbToLinear(c/65535); any
 * other value (synthetic or already processed data) is computed as before. The check is exact,
 * so the table can never change a result, only skip a Math.pow (most of this step's time).
 * Zero and −0 take the formula, which keeps the sign of −0.
 */
export function planeToLinear(plane: Plane): Plane {
	const src = planeValues(plane);
	const [height, width] = plane.shape;
	const out = createPlane(height, width);
	decodeRange(src, out.data, 0, src.length);
	return out;
}

/** {@link planeToLinear} of values [first, end) of `src` into `dst` (which may be `src`). */
export function decodeRange(src: Float32Array, dst: Float32Array, first: number, end: number): void {
	const { codes, linear } = decodeTables();
	for (let i = first; i < end; i++) {
		const v = src[i];
		const code = Math.round(v * CODES);
		if (code > 0 && code <= CODES && codes[code] === v) dst[i] = linear[code];
		// Black (±0, sign kept) as srgbToLinear computes it, without a call in the loop.
		else if (v === 0) dst[i] = v / 12.92;
		else dst[i] = srgbToLinear(v);
	}
}

/**
 * {@link toLinear} of colour.ts with {@link planeToLinear}: same planes, same bits.
 * @param parallel when given (a thread pool that runs row passes), large planes are copied into its
 *   shared memory and decoded there in place, their rows split between the threads. @default none
 */
export function imageToLinear(img: RasterImage, parallel?: BlockParallelism): RasterImage {
	if (img.transfer !== 'srgb') return { ...img, planes: img.planes.map((p) => createPlane(p.shape[0], p.shape[1], Float32Array.from(planeValues(p)))), transfer: 'linear' };
	const planes = img.planes.map((plane) => {
		const [height, width] = plane.shape;
		if (!parallel?.rows || height * width < PARALLEL_MIN_VALUES) return planeToLinear(plane);
		const values = parallel.allocate(height * width);
		values.set(planeValues(plane));
		parallel.rows({ kind: 'decode', values, rows: height, cols: width });
		return createPlane(height, width, values);
	});
	return { ...img, planes, transfer: 'linear' };
}

/** Smallest plane whose decoding is split between threads (common practice, no source). */
const PARALLEL_MIN_VALUES = 2 ** 19;
