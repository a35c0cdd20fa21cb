/**
 * The zoom view's geometry. The expectations are worked by hand from the affine map
 * screen = image · zoom + offset (common practice, no source) and the pyramid rule in the issue
 * ("smallest level whose scale ≥ zoom, capped at full resolution").
 */
import { describe, expect, test } from 'vitest';
import {
	clampZoom,
	constrainPan,
	fit,
	imageToScreen,
	levelForZoom,
	MAX_ZOOM,
	MIN_ZOOM,
	pixelAt,
	screenToImage,
	tileOfPixel,
	visibleRect,
	visibleTiles,
	zoomAbout,
	zoomLimits,
	type PyramidLevel
} from './viewport';

/** The server's levels for a 1000 × 600 original with 256-pixel tiles (sizes round up at each halving). */
const LEVELS: PyramidLevel[] = [
	{ level: 0, scale: 1, width: 1000, height: 600, columns: 4, rows: 3 },
	{ level: 1, scale: 0.5, width: 500, height: 300, columns: 2, rows: 2 },
	{ level: 2, scale: 0.25, width: 250, height: 150, columns: 1, rows: 1 }
];
const IMAGE = { width: 1000, height: 600 };
const VIEW = { width: 500, height: 500 };

describe('fit and zoom limits', () => {
	test('fit shows the whole image centred: the narrower ratio wins', () => {
		// 500/1000 = 0.5 across, 500/600 ≈ 0.83 down → 0.5; 600 · 0.5 = 300 tall, centred in 500 → y = 100.
		expect(fit(IMAGE, VIEW)).toEqual({ zoom: 0.5, x: 0, y: 100 });
	});

	test('a small image fits magnified, but never beyond 800 %', () => {
		expect(fit({ width: 100, height: 50 }, VIEW).zoom).toBe(5);
		expect(fit({ width: 10, height: 10 }, VIEW).zoom).toBe(MAX_ZOOM);
	});

	test('zoom is clamped to [fit, 800 %], to 100 % for small images and to 5 % for huge ones', () => {
		expect(zoomLimits(IMAGE, VIEW)).toEqual({ min: 0.5, max: 8 });
		expect(clampZoom(0.1, IMAGE, VIEW)).toBe(0.5);
		expect(clampZoom(20, IMAGE, VIEW)).toBe(8);
		expect(zoomLimits({ width: 100, height: 50 }, VIEW).min).toBe(1);
		expect(zoomLimits({ width: 100_000, height: 100_000 }, VIEW).min).toBe(MIN_ZOOM);
	});
});

describe('screen ↔ image', () => {
	const t = { zoom: 4, x: -100, y: 30 };

	test('the two conversions invert each other', () => {
		const p = { x: 123.25, y: 7.5 };
		const back = screenToImage(t, imageToScreen(t, p));
		expect(back.x).toBeCloseTo(p.x, 12);
		expect(back.y).toBeCloseTo(p.y, 12);
	});

	test('a screen point falls in the pixel whose square contains it', () => {
		// image x = (10 + 100) / 4 = 27.5 → pixel 27; y = (40 − 30) / 4 = 2.5 → pixel 2.
		expect(pixelAt(t, { x: 10, y: 40 }, IMAGE)).toEqual({ x: 27, y: 2 });
		// Left of the image's edge (x < 0) and past its bottom are no pixel at all.
		expect(pixelAt(t, { x: -101, y: 40 }, IMAGE)).toBeNull();
		expect(pixelAt(t, { x: 10, y: 30 + 600 * 4 }, IMAGE)).toBeNull();
	});
});

describe('zoom about a point', () => {
	test('the image point under the anchor stays under it', () => {
		const t = { zoom: 1, x: -200, y: -50 };
		const anchor = { x: 130, y: 270 };
		const before = screenToImage(t, anchor);
		const after = zoomAbout(t, 3, anchor, IMAGE, VIEW);
		expect(after.zoom).toBe(3);
		const still = screenToImage(after, anchor);
		expect(still.x).toBeCloseTo(before.x, 12);
		expect(still.y).toBeCloseTo(before.y, 12);
	});

	test('a zoom past the limit is clamped and the anchor still holds', () => {
		const t = { zoom: 6, x: 0, y: 0 };
		const anchor = { x: 40, y: 80 };
		const after = zoomAbout(t, 100, anchor, IMAGE, VIEW);
		expect(after.zoom).toBe(MAX_ZOOM);
		expect(screenToImage(after, anchor).x).toBeCloseTo(screenToImage(t, anchor).x, 12);
	});
});

describe('constrain pan', () => {
	test('an axis smaller than the view is centred; a larger one leaves no gap at its edges', () => {
		// At zoom 0.5 the image is 500 × 300 in a 500 × 500 view: x → 0, y → (500 − 300)/2 = 100.
		expect(constrainPan({ zoom: 0.5, x: 80, y: -40 }, IMAGE, VIEW)).toEqual({ zoom: 0.5, x: 0, y: 100 });
		// At zoom 2 the image is 2000 × 1200: x from −1500 to 0, y from −700 to 0.
		expect(constrainPan({ zoom: 2, x: 50, y: -900 }, IMAGE, VIEW)).toEqual({ zoom: 2, x: 0, y: -700 });
		expect(constrainPan({ zoom: 2, x: -300, y: -200 }, IMAGE, VIEW)).toEqual({ zoom: 2, x: -300, y: -200 });
	});
});

describe('pyramid level for a zoom', () => {
	test.each([
		[8, 0],
		[1, 0],
		[0.75, 0],
		[0.5, 1],
		[0.3, 1],
		[0.25, 2],
		[0.01, 2]
	])('zoom %f → level %i (smallest scale ≥ zoom; full resolution above 100 %%)', (zoom, level) => {
		expect(levelForZoom(LEVELS, zoom).level).toBe(level);
	});
});

describe('visible tiles', () => {
	test('at 100 % from the origin a 500 × 500 view needs columns 0–1 and rows 0–1 of level 0', () => {
		const tiles = visibleTiles(LEVELS[0], 256, { zoom: 1, x: 0, y: 0 }, VIEW);
		expect(tiles.map((t) => [t.column, t.row])).toEqual([
			[0, 0],
			[1, 0],
			[0, 1],
			[1, 1]
		]);
	});

	test('tiles outside the grid are never listed, and edge tiles are cropped', () => {
		// Panned to the bottom-right corner: image x 700–1200 and y 300–800 → columns 2–3, rows 1–2.
		const tiles = visibleTiles(LEVELS[0], 256, { zoom: 1, x: -700, y: -300 }, VIEW);
		expect(tiles.map((t) => [t.column, t.row])).toEqual([
			[2, 1],
			[3, 1],
			[2, 2],
			[3, 2]
		]);
		const corner = tiles.find((t) => t.column === 3 && t.row === 2)!;
		// 1000 − 3·256 = 232 wide, 600 − 2·256 = 88 tall.
		expect(corner).toMatchObject({ left: 768, top: 512, width: 232, height: 88 });
	});

	test('a coarser level spans more original pixels per tile', () => {
		const tiles = visibleTiles(LEVELS[1], 256, fit(IMAGE, VIEW), VIEW);
		expect(tiles).toHaveLength(4);
		// Level 1 column 1 is 500 − 256 = 244 level pixels = 488 original pixels wide, starting at 512.
		expect(tiles[1]).toMatchObject({ column: 1, row: 0, left: 512, width: 488, height: 512 });
	});

	test('a view that misses the image needs no tile', () => {
		expect(visibleTiles(LEVELS[0], 256, { zoom: 1, x: 2000, y: 0 }, VIEW)).toEqual([]);
	});
});

test('the pixel under the cursor is found in its full-resolution tile', () => {
	expect(tileOfPixel({ x: 600, y: 255 }, 256)).toEqual({ column: 2, row: 0, x: 88, y: 255 });
});

describe('visibleRect', () => {
	const image = { width: 960, height: 640 };
	test('the whole image when it fits inside the box', () => {
		expect(visibleRect({ zoom: 0.5, x: 20, y: 10 }, image, { width: 600, height: 400 })).toEqual({ x: 0, y: 0, width: 960, height: 640 });
	});
	test('at 200 % the box shows half its size in pixels, widened to whole pixels', () => {
		// screen 0..500 → image (0 − (−301))/2 = 150.5 … (500 + 301)/2 = 400.5 → pixels 150…400.
		expect(visibleRect({ zoom: 2, x: -301, y: -100 }, image, { width: 500, height: 300 })).toEqual({ x: 150, y: 50, width: 251, height: 150 });
	});
	test('null when the image is panned out of the box', () => {
		expect(visibleRect({ zoom: 1, x: 2000, y: 0 }, image, { width: 500, height: 300 })).toBeNull();
	});
});
