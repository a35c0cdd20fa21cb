/**
 * Which pixels the spectrum panel analyses: the region the technician picked, or else a square from
 * the middle of the original — always at full resolution (the region route), because a downscaled
 * preview would move the kernel's zeros by the scale factor and fold aliasing into the spectrum.
 */
import { DEFAULT_SPECTRUM_SIZE } from './spectrum-size';

export interface SpectrumRect {
	x: number;
	y: number;
	width: number;
	height: number;
}

/** The crop's URL and rectangle, or null when the item is too small to crop anything. */
export function spectrumSource(
	item: { id: number; width: number; height: number },
	region: SpectrumRect | null,
	side = DEFAULT_SPECTRUM_SIZE
): { src: string; rect: SpectrumRect } | null {
	const rect = region ?? centredSquare(item, side);
	if (!rect) return null;
	const query = new URLSearchParams({ x: String(rect.x), y: String(rect.y), width: String(rect.width), height: String(rect.height) });
	return { src: `/api/items/${item.id}/region?${query}`, rect };
}

function centredSquare(image: { width: number; height: number }, side: number): SpectrumRect | null {
	const n = Math.min(side, image.width, image.height);
	if (n < 1) return null;
	return { x: Math.floor((image.width - n) / 2), y: Math.floor((image.height - n) / 2), width: n, height: n };
}
