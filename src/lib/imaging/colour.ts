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
	return v <= 0.0031308 ? 12.92 * v : 1.055 * Math.pow(v, 1 / 2.4) - 0.055;
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
