/**
 * Which pixels the spectrum panel analyses: the region the technician picked, or else a square from
 * the middle of what the zoom view shows (the whole original before the view has a size) — always at full resolution (the region route), because a downscaled
 * preview would move the kernel's zeros by the scale factor and fold aliasing into the spectrum.
 */
import type { Region } from '../imaging/estimation/region';
import { DEFAULT_SPECTRUM_SIZE } from './spectrum-size';


/** The crop's URL and rectangle, or null when the item is too small to crop anything. */
export function spectrumSource(
	item: { id: number; width: number; height: number },
	region: Region | null,
	visible: Region | null = null,
	side = DEFAULT_SPECTRUM_SIZE
): { src: string; rect: Region } | null {
	const rect = region ?? centredSquare(visible ?? { x: 0, y: 0, width: item.width, height: item.height }, item, side);
	if (!rect) return null;
	const query = new URLSearchParams({ x: String(rect.x), y: String(rect.y), width: String(rect.width), height: String(rect.height) });
	return { src: `/api/items/${item.id}/region?${query}`, rect };
}

/** Fewest pixels a useful spectrum needs: zoomed far in, the square reaches beyond the screen to this. */
const MIN_SIDE = 128;

function centredSquare(area: Region, image: { width: number; height: number }, side: number): Region | null {
	const n = Math.min(side, image.width, image.height, Math.max(MIN_SIDE, Math.min(area.width, area.height)));
	if (n < 1) return null;
	const clamp = (start: number, length: number) => Math.min(Math.max(0, start), length - n);
	const x = clamp(area.x + Math.floor((area.width - n) / 2), image.width);
	const y = clamp(area.y + Math.floor((area.height - n) / 2), image.height);
	return { x, y, width: n, height: n };
}
