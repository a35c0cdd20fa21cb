/**
 * A restoration request, `{method, psf, params}`: shared by the workbench form, the JSON API
 * (`POST /api/items/{id}/runs`) and the tests. `psf` is the engine's own kernel spec. `params`
 * holds only the settings that shape the chosen method's result: a setting the method would
 * ignore is refused rather than recorded, because a run record must not claim a setting that
 * played no part (documentation of every step and its settings: SWGIT Section 11, v1.3 2010).
 * Omitted settings take the engine's defaults, which the engine writes to the run record.
 */
import { z } from 'zod';
import { kernelSpecSchema } from '../imaging/kernels/spec';

export const RUN_METHODS = ['wiener', 'rl', 'rltv', 'auto'] as const;
export type RunMethod = (typeof RUN_METHODS)[number];
export const RUN_STATUSES = ['queued', 'running', 'succeeded', 'failed', 'cancelled'] as const;
export type RunStatus = (typeof RUN_STATUSES)[number];

/** Largest iteration count accepted: RL amplifies noise as iterations grow, so very long runs only degrade (Dey et al. 2006). */
export const MAX_ITERATIONS = 500;
/**
 * RL-TV weight λ must stay below 0.25 so the divisor 1 − λ·div(∇x/|∇x|) stays positive
 * (Dey et al., Microscopy Research and Technique 69(4), 2006, doi:10.1002/jemt.20294); the
 * engine enforces the same bound.
 */
export const MAX_TV = 0.25;

/** Names the settings a method would ignore, instead of zod's generic "Unrecognized key". */
const onlyFor = (method: string) => ({
	error: (issue: z.core.$ZodRawIssue) =>
		issue.code === 'unrecognized_keys' ? `${issue.keys.join(', ')} does not apply to method ${method}` : undefined
});

const linearLight = z.boolean({ error: 'linearLight is true or false' }).optional();

const wienerParams = z.strictObject({
	nsr: z
		.union([z.literal('auto'), z.number({ error: 'nsr is a number ≥ 0 or "auto"' }).min(0, 'nsr must be ≥ 0')], {
			error: 'nsr is a number ≥ 0 or "auto"'
		})
		.optional(),
	regulariser: z.enum(['constant', 'laplacian'], { error: 'regulariser is constant or laplacian' }).optional(),
	boundary: z.enum(['taper', 'circular'], { error: 'boundary for Wiener is taper or circular' }).optional(),
	linearLight
}, onlyFor('wiener'));

const iterative = {
	iterations: z
		.int({ error: 'iterations must be a whole number' })
		.min(1, 'iterations must be at least 1')
		.max(MAX_ITERATIONS, `iterations must be at most ${MAX_ITERATIONS}`)
		.optional(),
	accelerate: z.boolean({ error: 'accelerate is true or false' }).optional(),
	stopping: z
		.strictObject({
			relativeChange: z
				.number({ error: 'relativeChange is a number' })
				.min(0, 'relativeChange must be ≥ 0 (0 runs every iteration)')
				.max(1, 'relativeChange must be at most 1')
				.optional()
		})
		.optional(),
	boundary: z
		.enum(['extended', 'taper', 'circular'], { error: 'boundary is extended, taper or circular' })
		.optional(),
	linearLight
};

const rlParams = z.strictObject(iterative, onlyFor('rl'));
const rltvParams = z.strictObject({
	...iterative,
	tv: z
		.number({ error: 'tv is a number' })
		.min(0, 'tv must be ≥ 0')
		.lt(MAX_TV, `tv must be below ${MAX_TV}`)
		.optional()
}, onlyFor('rltv'));
// Auto mode chooses method and settings from the image and kernel; only the colour model is the caller's.
const autoParams = z.strictObject({ linearLight }, onlyFor('auto'));

const request = <M extends RunMethod, P extends z.ZodType>(method: M, params: P) =>
	z.strictObject({ method: z.literal(method), psf: kernelSpecSchema, params });

export const newRunSchema = z.discriminatedUnion(
	'method',
	[
		request('wiener', wienerParams.default({})),
		request('rl', rlParams.default({})),
		request('rltv', rltvParams.default({})),
		request('auto', autoParams.default({}))
	],
	{ error: 'method is one of wiener, rl, rltv, auto' }
);

export type NewRun = z.infer<typeof newRunSchema>;
export type RunParams = NewRun['params'];
