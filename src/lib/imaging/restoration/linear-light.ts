import { srgbToLinear } from '../colour';
import { createPlane, planeValues, type Plane, type RasterImage } from '../types';

/** Every 16-bit code (8-bit codes n/255 are the 16-bit codes 257n/65535, the same real numbers). */
const CODES = 65535;
let table: Float64Array | undefined;

/** srgbToLinear of the float32 value of every code c/65535, computed once (512 KiB). */
function decodeTable(): Float64Array {
	if (table) return table;
	table = new Float64Array(CODES + 1);
	for (let c = 0; c <= CODES; c++) table[c] = srgbToLinear(Math.fround(c / CODES));
	return table;
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
	const dst = out.data;
	const lut = decodeTable();
	for (let i = 0; i < src.length; i++) {
		const v = src[i];
		const code = Math.round(v * CODES);
		dst[i] = code > 0 && code <= CODES && Math.fround(code / CODES) === v ? lut[code] : srgbToLinear(v);
	}
	return out;
}

/** {@link toLinear} of colour.ts with {@link planeToLinear}: same planes, same bits. */
export function imageToLinear(img: RasterImage): RasterImage {
	if (img.transfer !== 'srgb') return { ...img, planes: img.planes.map((p) => createPlane(p.shape[0], p.shape[1], Float32Array.from(planeValues(p)))), transfer: 'linear' };
	return { ...img, planes: img.planes.map(planeToLinear), transfer: 'linear' };
}
