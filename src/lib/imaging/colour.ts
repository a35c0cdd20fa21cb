import { createPlane, planeValues, type Plane, type RasterImage } from './types';

/**
 * sRGB electro-optical decode of one encoded value c ∈ [0, 1]:
 * c ≤ 0.04045 → c / 12.92, otherwise ((c + 0.055) / 1.055)^2.4.
 * @see IEC 61966-2-1:1999, Multimedia systems and equipment — Colour measurement and management —
 *   Part 2-1: Default RGB colour space — sRGB, §5.2.
 */
export function srgbToLinear(v: number): number {
	if (!Number.isFinite(v)) throw new RangeError(`sRGB value must be finite, got ${v}`);
	return v <= 0.04045 ? v / 12.92 : Math.pow((v + 0.055) / 1.055, 2.4);
}

/**
 * sRGB encode of one linear-light value l ∈ [0, 1]:
 * l ≤ 0.0031308 → 12.92·l, otherwise 1.055·l^(1/2.4) − 0.055.
 * Negative values (deconvolution undershoot) stay on the linear segment instead of producing NaN.
 * @see IEC 61966-2-1:1999, §5.3.
 */
export function linearToSrgb(v: number): number {
	if (!Number.isFinite(v)) throw new RangeError(`linear value must be finite, got ${v}`);
	return v <= 0.0031308 ? 12.92 * v : encodePowerSegment(v);
}

/** The power segment of the sRGB encode, 1.055·l^(1/2.4) − 0.055 (IEC 61966-2-1:1999, §5.3). */
function encodePowerSegment(v: number): number {
	return 1.055 * Math.pow(v, 1 / 2.4) - 0.055;
}

/** Mantissa bits of a float32 that index the encoder's root table (1024 entries). */
const ROOT_BITS = 10;
const LOW_BITS = 23 - ROOT_BITS;
/**
 * Half-width of the interval around the fast estimate inside which the exact result must lie
 * (absolute). The estimate and Math.pow each err by a few double ulps (< 1e-15 here); 2^-40 ≈ 9e-13
 * leaves a factor of several hundred, and still decides all but ≈ 0.05 % of values without Math.pow.
 */
const ENCODE_MARGIN = 2 ** -40;
const ENCODE_EXPONENT = 1 / 2.4;
let encodeTables: { scale: Float64Array; root: Float64Array; inverse: Float64Array; series: Float64Array } | undefined;

/**
 * Tables of the fast encoder: 2^(e/2.4) for the binary exponents e = −9 … −1 of (0.0031308, 1),
 * m₀^(1/2.4) and 1/m₀ at the 1024 mantissa steps m₀ = 1 + i/1024, and the binomial series
 * coefficients of (1 + t)^(1/2.4) up to t⁴.
 */
function encoderTables() {
	if (encodeTables) return encodeTables;
	const scale = new Float64Array(9);
	for (let e = -9; e <= -1; e++) scale[e + 9] = Math.pow(2, e * ENCODE_EXPONENT);
	const steps = 1 << ROOT_BITS;
	const root = new Float64Array(steps);
	const inverse = new Float64Array(steps);
	for (let i = 0; i < steps; i++) {
		root[i] = Math.pow(1 + i / steps, ENCODE_EXPONENT);
		inverse[i] = 1 / (1 + i / steps);
	}
	const series = new Float64Array(5);
	series[0] = 1;
	for (let k = 1; k < series.length; k++) series[k] = (series[k - 1] * (ENCODE_EXPONENT - k + 1)) / k;
	return (encodeTables = { scale, root, inverse, series });
}

/**
 * {@link linearToSrgb} of every value of a float32 array, rounded to float32, bit-identical to
 * `Float32Array.from(values, linearToSrgb)` but mostly without Math.pow (which was most of the time
 * of re-encoding a restored photograph). On the power segment a value v = 2^e·m (its float32 bits)
 * is split as m = m₀(1 + t), 0 ≤ t < 2^−10, and v^(1/2.4) = 2^(e/2.4) · m₀^(1/2.4) · (1 + t)^(1/2.4)
 * with the binomial series to t⁴ (next term < 3e−17 relative). The float32 result is accepted only
 * when every number within {@link ENCODE_MARGIN} of the estimate rounds to the same float32, so it
 * equals the rounding of the exact formula whatever Math.pow's last bits; otherwise the formula is
 * evaluated. Values on the linear segment, 1 and above go through the formula.
 * @see IEC 61966-2-1:1999, §5.3; binomial series: Abramowitz & Stegun, Handbook of Mathematical
 *   Functions, 1964, 3.6.9.
 * @param output receives the encoded values; may be `values` itself. @default a new array
 * @throws RangeError for a non-finite value, as linearToSrgb.
 */
export function linearToSrgbArray(values: Float32Array, output: Float32Array = new Float32Array(values.length)): Float32Array {
	if (output.length !== values.length) throw new RangeError(`output holds ${output.length} values, expected ${values.length}`);
	const { scale, root, inverse, series } = encoderTables();
	const c1 = series[1];
	const c2 = series[2];
	const c3 = series[3];
	const c4 = series[4];
	const bits = new Int32Array(values.buffer, values.byteOffset, values.length);
	const lowScale = 2 ** -23;
	const lowMask = (1 << LOW_BITS) - 1;
	for (let i = 0; i < values.length; i++) {
		const v = values[i];
		if (v > 0.0031308 && v < 1) {
			const b = bits[i];
			const mantissa = b & 0x7fffff;
			const step = mantissa >>> LOW_BITS;
			const t = (mantissa & lowMask) * lowScale * inverse[step];
			const power = scale[(b >>> 23) - 118] * root[step] * (1 + t * (c1 + t * (c2 + t * (c3 + t * c4))));
			const encoded = 1.055 * power - 0.055;
			const low = Math.fround(encoded - ENCODE_MARGIN);
			output[i] = low === Math.fround(encoded + ENCODE_MARGIN) ? low : encodePowerSegment(v);
		} else if (v <= 0.0031308 && v > -Infinity) {
			// The linear segment (clipped blacks and undershoot are common), written out so that the
			// loop calls nothing that can throw.
			output[i] = 12.92 * v;
		} else if (v >= 1 && v < Infinity) {
			output[i] = encodePowerSegment(v);
		} else {
			output[i] = linearToSrgb(v);
		}
	}
	return output;
}

function mapPlane(plane: Plane, f: (v: number) => number): Plane {
	const src = planeValues(plane);
	const [height, width] = plane.shape;
	const out = createPlane(height, width);
	for (let i = 0; i < src.length; i++) out.data[i] = f(src[i]);
	return out;
}

/**
 * Decode an sRGB image to linear light (new planes), so blur acts linearly on light as the
 * deconvolution model assumes (Tai et al., IEEE TPAMI 35(10), 2013, doi:10.1109/TPAMI.2012.266).
 * A linear image is copied unchanged.
 */
export function toLinear(img: RasterImage): RasterImage {
	const f = img.transfer === 'srgb' ? srgbToLinear : (v: number) => v;
	return { ...img, planes: img.planes.map((p) => mapPlane(p, f)), transfer: 'linear' };
}

/** Encode a linear-light image to sRGB (IEC 61966-2-1); an sRGB image is copied unchanged. */
export function toSrgb(img: RasterImage): RasterImage {
	const f = img.transfer === 'linear' ? linearToSrgb : (v: number) => v;
	return { ...img, planes: img.planes.map((p) => mapPlane(p, f)), transfer: 'srgb' };
}
