/**
 * The zoom view's geometry, kept pure so it can be tested without a browser: one affine map from
 * original pixels to screen pixels, zooming about a point, the pyramid level to draw at a zoom,
 * and the tiles a view needs. Image coordinates are continuous: pixel (i, j) covers
 * [i, i+1) × [j, j+1), so its centre is (i + ½, j + ½) — common practice, no source.
 */
import type { Region } from '../imaging/estimation/region';

/** screen = image · zoom + (x, y): CSS pixels relative to the view box's top-left corner; image in original pixels. */
export interface ViewTransform {
	zoom: number;
	x: number;
	y: number;
}

export interface Size {
	width: number;
	height: number;
}

export interface Point {
	x: number;
	y: number;
}

/** One level of the server's pyramid, as its manifest lists it (src/lib/server/tiles/pyramid.ts builds it). */
export interface PyramidLevel {
	/** 0 = full resolution; level k is the original halved k times. */
	level: number;
	/** Level pixels per original pixel: exactly 2^-level. */
	scale: number;
	width: number;
	height: number;
	columns: number;
	rows: number;
}

export interface VisibleTile {
	level: number;
	column: number;
	row: number;
	/** The tile's footprint in original pixels (may run past the image's right/bottom edge by < 2^level px). */
	left: number;
	top: number;
	width: number;
	height: number;
}

/** 800 %: one original pixel as an 8 × 8 block, enough to read single values. */
export const MAX_ZOOM = 8;
/** The least zoom allowed when even fitting the image would need less. */
export const MIN_ZOOM = 0.05;

/** The zoom that shows the whole image, capped at MAX_ZOOM (a tiny image is not blown up further). */
export function fitZoom(image: Size, view: Size): number {
	if (image.width <= 0 || image.height <= 0 || view.width <= 0 || view.height <= 0) return 1;
	return Math.min(view.width / image.width, view.height / image.height, MAX_ZOOM);
}

/**
 * The zoom range: from fit (or 100 % when the image is smaller than the view, or MIN_ZOOM when
 * fitting would need less) up to MAX_ZOOM.
 */
export function zoomLimits(image: Size, view: Size): { min: number; max: number } {
	return { min: Math.max(MIN_ZOOM, Math.min(fitZoom(image, view), 1)), max: MAX_ZOOM };
}

export function clampZoom(zoom: number, image: Size, view: Size): number {
	const { min, max } = zoomLimits(image, view);
	return Math.min(max, Math.max(min, zoom));
}

/** The whole image, centred. */
export function fit(image: Size, view: Size): ViewTransform {
	const zoom = Math.max(MIN_ZOOM, fitZoom(image, view));
	return { zoom, x: (view.width - image.width * zoom) / 2, y: (view.height - image.height * zoom) / 2 };
}

export function screenToImage(t: ViewTransform, p: Point): Point {
	return { x: (p.x - t.x) / t.zoom, y: (p.y - t.y) / t.zoom };
}

export function imageToScreen(t: ViewTransform, p: Point): Point {
	return { x: p.x * t.zoom + t.x, y: p.y * t.zoom + t.y };
}

/** The original pixel under a screen point, or null outside the image. */
export function pixelAt(t: ViewTransform, p: Point, image: Size): Point | null {
	const q = screenToImage(t, p);
	const x = Math.floor(q.x);
	const y = Math.floor(q.y);
	return x >= 0 && y >= 0 && x < image.width && y < image.height ? { x, y } : null;
}

/**
 * The original pixels at least partly on screen: the view box mapped back to the image and
 * clipped to it, widened to whole pixels. Null when no pixel of the image is in view.
 */
export function visibleRect(t: ViewTransform, image: Size, view: Size): Region | null {
	const a = screenToImage(t, { x: 0, y: 0 });
	const b = screenToImage(t, { x: view.width, y: view.height });
	const x0 = Math.max(0, Math.floor(a.x));
	const y0 = Math.max(0, Math.floor(a.y));
	const x1 = Math.min(image.width, Math.ceil(b.x));
	const y1 = Math.min(image.height, Math.ceil(b.y));
	return x1 > x0 && y1 > y0 ? { x: x0, y: y0, width: x1 - x0, height: y1 - y0 } : null;
}

/**
 * Set a new zoom (clamped) while the image point under `anchor` (screen) stays under it:
 * from anchor = p·z + t and anchor = p·z' + t' follows t' = anchor − (anchor − t)·z'/z.
 */
export function zoomAbout(t: ViewTransform, zoom: number, anchor: Point, image: Size, view: Size): ViewTransform {
	const next = clampZoom(zoom, image, view);
	const k = next / t.zoom;
	return { zoom: next, x: anchor.x - (anchor.x - t.x) * k, y: anchor.y - (anchor.y - t.y) * k };
}

/**
 * Keep the picture in view: along an axis where it is smaller than the view it is centred, and
 * where it is larger no gap is left between its edge and the view's.
 */
export function constrainPan(t: ViewTransform, image: Size, view: Size): ViewTransform {
	const axis = (offset: number, imageSide: number, viewSide: number) => {
		const side = imageSide * t.zoom;
		if (side <= viewSide) return (viewSide - side) / 2;
		return Math.min(0, Math.max(viewSide - side, offset));
	};
	return { zoom: t.zoom, x: axis(t.x, image.width, view.width), y: axis(t.y, image.height, view.height) };
}

/**
 * The level to draw at a zoom (in device pixels per original pixel): the smallest level whose
 * scale is still ≥ the zoom, so a level pixel is never magnified below 100 %; level 0 above it.
 */
export function levelForZoom(levels: readonly PyramidLevel[], zoom: number): PyramidLevel {
	if (levels.length === 0) throw new RangeError('a pyramid has at least one level');
	let best = levels.find((l) => l.level === 0) ?? levels[0];
	for (const level of levels) {
		if (level.scale >= zoom && level.scale < best.scale) best = level;
	}
	return best;
}

/** The tiles of `level` that intersect the view, row by row. */
export function visibleTiles(level: PyramidLevel, tileSize: number, t: ViewTransform, view: Size): VisibleTile[] {
	const topLeft = screenToImage(t, { x: 0, y: 0 });
	const bottomRight = screenToImage(t, { x: view.width, y: view.height });
	const span = tileSize / level.scale;
	const first = (v: number) => Math.max(0, Math.floor(v / span));
	const last = (v: number, count: number) => Math.min(count - 1, Math.ceil(v / span) - 1);
	const tiles: VisibleTile[] = [];
	for (let row = first(topLeft.y); row <= last(bottomRight.y, level.rows); row++) {
		for (let column = first(topLeft.x); column <= last(bottomRight.x, level.columns); column++) {
			const levelWidth = Math.min(tileSize, level.width - column * tileSize);
			const levelHeight = Math.min(tileSize, level.height - row * tileSize);
			tiles.push({
				level: level.level,
				column,
				row,
				left: column * span,
				top: row * span,
				width: levelWidth / level.scale,
				height: levelHeight / level.scale
			});
		}
	}
	return tiles;
}

/** Which full-resolution tile holds an original pixel, and where in it. */
export function tileOfPixel(p: Point, tileSize: number): { column: number; row: number; x: number; y: number } {
	const column = Math.floor(p.x / tileSize);
	const row = Math.floor(p.y / tileSize);
	return { column, row, x: p.x - column * tileSize, y: p.y - row * tileSize };
}
