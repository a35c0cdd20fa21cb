import { srgbToLinear } from '../colour';
import { planeValues, type RasterImage } from '../types';

export interface ClippedFractionOptions {
	/**
	 * Encoded value at or above which a channel counts as saturated.
	 * @default 1 − 0.5 / (2^sourceBitDepth − 1): values that round to the top code.
	 */
	level?: number;
}

/**
 * Share of pixels whose value reaches saturation in at least one channel. Clipped highlights break
 * the linear blur model and ring after deconvolution, so the run record reports this share.
 * The level is given on the encoded (sRGB) scale; for a linear image it is decoded first.
 * @see O. Whyte, J. Sivic, A. Zisserman, "Deblurring Shaken and Partially Saturated Images",
 *   International Journal of Computer Vision 110(2):185–201, 2014, doi:10.1007/s11263-014-0727-3.
 * @throws RangeError for a level outside (0, 1] or an image without planes.
 */
export function clippedFraction(img: RasterImage, opts: ClippedFractionOptions = {}): number {
	if (img.planes.length === 0) throw new RangeError('image has no planes');
	const level = opts.level ?? 1 - 0.5 / (2 ** img.sourceBitDepth - 1);
	if (!(level > 0 && level <= 1)) throw new RangeError(`level must lie in (0, 1], got ${level}`);
	const threshold = img.transfer === 'linear' ? srgbToLinear(level) : level;
	const n = img.width * img.height;
	const clipped = new Uint8Array(n);
	for (const plane of img.planes) {
		const d = planeValues(plane);
		for (let i = 0; i < n; i++) if (d[i] >= threshold) clipped[i] = 1;
	}
	let count = 0;
	for (let i = 0; i < n; i++) count += clipped[i];
	return count / n;
}
