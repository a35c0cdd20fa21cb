/**
 * The zoom view's requests: a tile's position in the pyramid (path parameters) and a
 * full-resolution region of the original (query string). Both arrive as text, so each number is
 * checked as digits first — "1.5", "-1", "" and "1e3" are refused with the field's name rather
 * than coerced. Whether a position or rectangle lies inside the image is the service's check.
 */
import { z } from 'zod';

/** Largest region side served at once: 1024² × 4 samples ≈ 4 MB of pixels. */
export const REGION_MAX_SIDE = 1024;

const whole = (what: string) =>
	z
		.string({ error: `${what} is required` })
		.regex(/^(0|[1-9][0-9]{0,8})$/, { error: `${what} must be a non-negative whole number` })
		.transform(Number);

export const tilePositionSchema = z.object({
	level: whole('level'),
	column: whole('column'),
	row: whole('row')
});

export type TilePosition = z.infer<typeof tilePositionSchema>;

const side = (what: string) =>
	whole(what).refine((n) => n >= 1 && n <= REGION_MAX_SIDE, { error: `${what} must be between 1 and ${REGION_MAX_SIDE}` });

export const regionQuerySchema = z.object({
	x: whole('x'),
	y: whole('y'),
	width: side('width'),
	height: side('height')
});

export type RegionQuery = z.infer<typeof regionQuerySchema>;
