/**
 * Requests that make a kernel from the photograph itself. `POST /api/items/{id}/streak` takes
 * `{region}`: the box, in the original's pixels (x right, y down), around the streak an isolated
 * point light left; at most KERNEL_LIMITS.maxImageSide on a side, because the kernel it yields
 * can be no larger. Whether the box lies inside the image is checked by the service, which knows
 * the image's size.
 */
import { z } from 'zod';
import { KERNEL_LIMITS } from '../imaging/kernels/spec';

const MAX = KERNEL_LIMITS.maxImageSide;
const coordinate = (what: string) => z.int({ error: `region ${what} must be an integer` }).min(0, { error: `region ${what} must be ≥ 0` });
const side = (what: string) =>
	z
		.int({ error: `region ${what} must be an integer` })
		.min(1, { error: `region ${what} must be ≥ 1` })
		.max(MAX, { error: `region ${what} must be at most ${MAX} pixels (the largest kernel)` });

export const streakRequestSchema = z.strictObject({
	region: z.strictObject(
		{ x: coordinate('x'), y: coordinate('y'), width: side('width'), height: side('height') },
		{ error: 'region is required: {x, y, width, height} in original pixels' }
	)
});

export type StreakRequest = z.infer<typeof streakRequestSchema>;
