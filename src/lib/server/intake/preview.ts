/**
 * The display derivative: at most PREVIEW_EDGE pixels on the long edge, 8-bit sRGB PNG, made with
 * sharp's default Lanczos kernel. Embedded ICC profiles are honoured on the way to sRGB so the
 * preview looks as the original is meant to; the original itself is never served resized.
 */
import sharp from 'sharp';
import { decodeOptions } from './inspect';

export const PREVIEW_EDGE = 2048;

export const previewKey = (sha256: string) => `previews/${sha256}-${PREVIEW_EDGE}.png`;

export function makePreview(path: string, maxPixels: number): Promise<Buffer> {
	return sharp(path, decodeOptions(maxPixels))
		.resize({ width: PREVIEW_EDGE, height: PREVIEW_EDGE, fit: 'inside', withoutEnlargement: true })
		.toColourspace('srgb')
		.png()
		.toBuffer();
}
