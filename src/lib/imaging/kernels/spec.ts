import { z } from 'zod';

/** Largest accepted sizes; they bound memory and keep a replay spec small. */
export const KERNEL_LIMITS = {
	maxLength: 512,
	maxRadius: 256,
	maxSigma: 128,
	maxPathPoints: 2000,
	maxImageSide: 257
} as const;

/**
 * A blur kernel (PSF) as a small JSON document, enough to rebuild the exact kernel on replay.
 * - `line`: straight motion of `length` pixels at `angleDeg` counter-clockwise from +x as seen on
 *   screen (image y points down, so +90° points up the screen).
 * - `path`: camera-shake trajectory in image pixel coordinates; `weights[s]` is the share of the
 *   exposure spent on segment s (dwell), default proportional to segment length (uniform speed);
 *   `smooth` draws a Catmull–Rom curve through the points instead of straight segments.
 * - `disk`: uniform defocus disk of `radius` pixels.
 * - `gaussian`: isotropic Gaussian of standard deviation `sigma` pixels.
 * - `image`: explicit non-negative values, row-major `height × width`.
 */
export type KernelSpec =
	| { kind: 'line'; length: number; angleDeg: number }
	| { kind: 'path'; points: [number, number][]; weights?: number[]; smooth?: boolean }
	| { kind: 'disk'; radius: number }
	| { kind: 'gaussian'; sigma: number }
	| { kind: 'image'; width: number; height: number; data: number[]; origin?: 'upload' | 'streak' };

const L = KERNEL_LIMITS;
const finite = (what: string) => z.number({ error: `${what} must be a finite number` });

const lineSchema = z.strictObject({
	kind: z.literal('line'),
	length: finite('line length')
		.positive({ error: 'line length must be positive' })
		.max(L.maxLength, { error: `line length must be at most ${L.maxLength} pixels` }),
	angleDeg: finite('line angle')
});

const pathSchema = z
	.strictObject({
		kind: z.literal('path'),
		points: z
			.array(z.tuple([finite('path x'), finite('path y')]))
			.min(1, { error: 'path needs at least one point' })
			.max(L.maxPathPoints, { error: `path may have at most ${L.maxPathPoints} points` }),
		weights: z.array(finite('path weight').nonnegative({ error: 'path weights must be non-negative' })).optional(),
		smooth: z.boolean().optional()
	})
	.superRefine((spec, ctx) => {
		if (spec.weights === undefined) return;
		const segments = spec.points.length - 1;
		if (spec.weights.length !== segments) {
			ctx.addIssue({
				code: 'custom',
				path: ['weights'],
				message: `path weights must have one value per segment (${segments}), got ${spec.weights.length}`
			});
		} else if (segments > 0 && !spec.weights.some((w) => w > 0)) {
			ctx.addIssue({ code: 'custom', path: ['weights'], message: 'path weights must not all be zero' });
		}
	});

const diskSchema = z.strictObject({
	kind: z.literal('disk'),
	radius: finite('disk radius')
		.positive({ error: 'disk radius must be positive' })
		.max(L.maxRadius, { error: `disk radius must be at most ${L.maxRadius} pixels` })
});

const gaussianSchema = z.strictObject({
	kind: z.literal('gaussian'),
	sigma: finite('gaussian sigma')
		.positive({ error: 'gaussian sigma must be positive' })
		.max(L.maxSigma, { error: `gaussian sigma must be at most ${L.maxSigma} pixels` })
});

const side = (what: string) =>
	z
		.int({ error: `image ${what} must be an integer` })
		.min(1, { error: `image ${what} must be at least 1` })
		.max(L.maxImageSide, { error: `image ${what} must be at most ${L.maxImageSide} pixels` });

const imageSchema = z
	.strictObject({
		kind: z.literal('image'),
		width: side('width'),
		height: side('height'),
		data: z.array(finite('image value').nonnegative({ error: 'image kernel values must be non-negative' })),
		origin: z.enum(['upload', 'streak']).optional()
	})
	.superRefine((spec, ctx) => {
		if (spec.data.length !== spec.width * spec.height) {
			ctx.addIssue({
				code: 'custom',
				path: ['data'],
				message: `image kernel needs width·height = ${spec.width * spec.height} values, got ${spec.data.length}`
			});
		} else if (!spec.data.some((v) => v > 0)) {
			ctx.addIssue({ code: 'custom', path: ['data'], message: 'image kernel values must have a positive sum' });
		}
	});

/** zod 4 schema of {@link KernelSpec} with the engine's bounds; messages name the field and limit. */
export const kernelSpecSchema: z.ZodType<KernelSpec> = z.discriminatedUnion(
	'kind',
	[lineSchema, pathSchema, diskSchema, gaussianSchema, imageSchema],
	{ error: 'kernel kind must be one of line, path, disk, gaussian, image' }
);
