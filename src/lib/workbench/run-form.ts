/**
 * The workbench's run form: one flat set of fields (what a person edits) mapped onto the API's
 * `{method, psf, params}` request. The mapping sends only the settings the chosen method uses,
 * and the result is validated again with `newRunSchema` — the same schema as
 * `POST /api/items/{id}/runs` — so the form can never record a setting the API would refuse.
 */
import { z } from 'zod';
import { KERNEL_LIMITS, kernelSpecSchema, type KernelSpec } from '../imaging/kernels/spec';
import { MAX_ITERATIONS, MAX_TV, RUN_METHODS, type NewRun } from '../schemas/run';

export const FORM_KERNEL_KINDS = ['line', 'disk', 'gaussian', 'path', 'image'] as const;
export type FormKernelKind = (typeof FORM_KERNEL_KINDS)[number];

export const KERNEL_KIND_LABELS: Record<FormKernelKind, string> = {
	line: 'Straight motion',
	disk: 'Defocus disk',
	gaussian: 'Gaussian',
	path: 'Drawn path',
	image: 'Kernel image (streak or upload)'
};

/** Kinds whose spec is too large for form fields: the drawing tools and the streak/upload routes put its JSON in `kernelJson`. */
const JSON_KINDS: readonly FormKernelKind[] = ['path', 'image'];

/** The spec held in `kernelJson`, or a message naming what is wrong with it. */
export function parseKernelJson(text: string, kind: FormKernelKind): { spec: KernelSpec } | { problem: string } {
	const what = kind === 'path' ? 'Draw a path on the image' : 'Take a kernel from a light streak or upload a PSF image';
	if (text.trim() === '') return { problem: `${what} first` };
	let doc: unknown;
	try {
		doc = JSON.parse(text);
	} catch {
		return { problem: 'The kernel JSON is not valid JSON' };
	}
	const parsed = kernelSpecSchema.safeParse(doc);
	if (!parsed.success) return { problem: `The kernel is not valid: ${parsed.error.issues.map((i) => i.message).join('; ')}` };
	if (parsed.data.kind !== kind) return { problem: `The kernel JSON holds a ${parsed.data.kind} kernel, not ${kind === 'path' ? 'a drawn path' : 'a kernel image'}` };
	return { spec: parsed.data };
}

export const METHOD_LABELS: Record<(typeof RUN_METHODS)[number], string> = {
	wiener: 'Wiener',
	rl: 'Richardson–Lucy',
	rltv: 'Richardson–Lucy + TV',
	auto: 'Automatic'
};

const L = KERNEL_LIMITS;
const number = (what: string) => z.number({ error: `${what} must be a number` });

export const runFormSchema = z.object({
	kernelKind: z.enum(FORM_KERNEL_KINDS, { error: 'Choose a kernel kind' }).default('line'),
	length: number('Length').positive('Length must be positive').max(L.maxLength, `Length is at most ${L.maxLength} px`).default(9),
	angleDeg: number('Angle').min(-180, 'Angle is between −180° and 180°').max(180, 'Angle is between −180° and 180°').default(0),
	radius: number('Radius').positive('Radius must be positive').max(L.maxRadius, `Radius is at most ${L.maxRadius} px`).default(3),
	sigma: number('Sigma').positive('Sigma must be positive').max(L.maxSigma, `Sigma is at most ${L.maxSigma} px`).default(1.5),
	method: z.enum(RUN_METHODS, { error: 'Choose a method' }).default('wiener'),
	nsrAuto: z.boolean().default(true),
	nsr: number('NSR').min(0, 'NSR must be ≥ 0').max(10, 'NSR is at most 10').default(0.01),
	iterations: z.int({ error: 'Iterations must be a whole number' }).min(1, 'At least 1 iteration').max(MAX_ITERATIONS, `At most ${MAX_ITERATIONS} iterations`).default(30),
	tv: number('TV strength').min(0, 'TV strength must be ≥ 0').lt(MAX_TV, `TV strength must be below ${MAX_TV}`).default(0.002),
	linearLight: z.boolean().default(true),
	/** JSON of the `path` or `image` spec when kernelKind is one of those; ignored otherwise. */
	kernelJson: z.string({ error: 'Kernel JSON must be text' }).max(2_000_000, 'The kernel JSON is too long').default('')
}).superRefine((form, ctx) => {
	if (!JSON_KINDS.includes(form.kernelKind)) return;
	const result = parseKernelJson(form.kernelJson, form.kernelKind);
	if ('problem' in result) ctx.addIssue({ code: 'custom', path: ['kernelJson'], message: result.problem });
});

export type RunForm = z.infer<typeof runFormSchema>;

/**
 * The kernel spec the form describes. For `path` and `image` it is the spec in `kernelJson`; while
 * that is missing or invalid, an empty spec of the kind comes back, which the engine's schema
 * refuses with a message (the kernel panel shows it; the form's own check blocks the submit).
 */
export function kernelSpecOf(form: Pick<RunForm, 'kernelKind' | 'length' | 'angleDeg' | 'radius' | 'sigma'> & { kernelJson?: string }): KernelSpec {
	switch (form.kernelKind) {
		case 'path':
		case 'image': {
			const result = parseKernelJson(form.kernelJson ?? '', form.kernelKind);
			if ('spec' in result) return result.spec;
			return form.kernelKind === 'path' ? { kind: 'path', points: [] } : { kind: 'image', width: 0, height: 0, data: [] };
		}
		case 'line':
			return { kind: 'line', length: form.length, angleDeg: form.angleDeg };
		case 'disk':
			return { kind: 'disk', radius: form.radius };
		case 'gaussian':
			return { kind: 'gaussian', sigma: form.sigma };
	}
}

/** The API request for the form: only the chosen method's settings travel. */
export function toNewRun(form: RunForm): NewRun {
	const psf = kernelSpecOf(form);
	const { linearLight } = form;
	switch (form.method) {
		case 'wiener':
			return { method: 'wiener', psf, params: { nsr: form.nsrAuto ? 'auto' : form.nsr, linearLight } };
		case 'rl':
			return { method: 'rl', psf, params: { iterations: form.iterations, linearLight } };
		case 'rltv':
			return { method: 'rltv', psf, params: { iterations: form.iterations, tv: form.tv, linearLight } };
		case 'auto':
			return { method: 'auto', psf, params: { linearLight } };
	}
}

/** Where a message about an API field (`psf.length`, `params.nsr`) belongs on the form. */
export function formFieldOf(apiPath: string): keyof RunForm | undefined {
	const leaf = apiPath.split('.').at(-1) ?? '';
	if (leaf in runFormSchema.shape) return leaf as keyof RunForm;
	// psf.points.3.0, psf.data, psf.weights…: parts of a drawn or image kernel, which the form holds as JSON.
	return apiPath.startsWith('psf.') ? 'kernelJson' : undefined;
}

/** The settings of a run as one short line, e.g. `line L=9 θ=30° · nsr=auto · linear`. */
export function describeRun(run: { method: string; psf: unknown; params: unknown }): string {
	const psf = run.psf as Record<string, unknown>;
	const kernel =
		psf.kind === 'line'
			? `line L=${psf.length} θ=${psf.angleDeg}°`
			: psf.kind === 'disk'
				? `disk r=${psf.radius}`
				: psf.kind === 'gaussian'
					? `gaussian σ=${psf.sigma}`
					: psf.kind === 'path'
						? `path ${(psf.points as unknown[]).length} pts`
						: psf.kind === 'image'
							? `image ${psf.width}×${psf.height}${psf.origin ? ` (${psf.origin})` : ''}`
							: String(psf.kind);
	const params = Object.entries((run.params ?? {}) as Record<string, unknown>)
		.filter(([key]) => key !== 'linearLight')
		.map(([key, value]) => `${key}=${typeof value === 'object' ? JSON.stringify(value) : value}`);
	const light = (run.params as { linearLight?: boolean } | null)?.linearLight === false ? 'sRGB' : 'linear';
	return [kernel, ...params, light].join(' · ');
}
