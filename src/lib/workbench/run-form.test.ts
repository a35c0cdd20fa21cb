import { describe, expect, it } from 'vitest';
import { buildKernel } from '../imaging/kernels/build';
import { newRunSchema } from '../schemas/run';
import { describeRun, formFieldOf, kernelSpecOf, runFormSchema, toNewRun, type RunForm } from './run-form';

const defaults: RunForm = runFormSchema.parse({});

describe('toNewRun', () => {
	it.each(['wiener', 'rl', 'rltv', 'auto'] as const)('sends a %s request the API schema accepts unchanged', (method) => {
		const request = toNewRun({ ...defaults, method });
		const parsed = newRunSchema.safeParse(request);
		expect(parsed.success, JSON.stringify(parsed.error?.issues)).toBe(true);
		expect(parsed.data).toEqual(request);
	});

	it('sends only the settings the method uses', () => {
		expect(toNewRun({ ...defaults, method: 'wiener', nsrAuto: false, nsr: 0.02 }).params).toEqual({ nsr: 0.02, linearLight: true });
		expect(toNewRun({ ...defaults, method: 'rl', iterations: 12 }).params).toEqual({ iterations: 12, linearLight: true });
		expect(toNewRun({ ...defaults, method: 'auto', linearLight: false }).params).toEqual({ linearLight: false });
	});

	it('describes the kernel the form shows, which the engine builds the same way', () => {
		const spec = kernelSpecOf({ ...defaults, kernelKind: 'line', length: 9, angleDeg: 30 });
		expect(spec).toEqual({ kind: 'line', length: 9, angleDeg: 30 });
		expect(Array.from(buildKernel(spec).data)).toEqual(Array.from(buildKernel({ kind: 'line', length: 9, angleDeg: 30 }).data));
		expect(kernelSpecOf({ ...defaults, kernelKind: 'disk', radius: 4 })).toEqual({ kind: 'disk', radius: 4 });
		expect(kernelSpecOf({ ...defaults, kernelKind: 'gaussian', sigma: 2 })).toEqual({ kind: 'gaussian', sigma: 2 });
	});
});

describe('formFieldOf', () => {
	it('maps API paths to form fields', () => {
		expect(formFieldOf('psf.length')).toBe('length');
		expect(formFieldOf('params.tv')).toBe('tv');
		expect(formFieldOf('method')).toBe('method');
		expect(formFieldOf('psf')).toBeUndefined();
	});
});

describe('describeRun', () => {
	it('names kernel, settings and colour model', () => {
		expect(describeRun({ method: 'wiener', psf: { kind: 'line', length: 9, angleDeg: 30 }, params: { nsr: 'auto', linearLight: true } })).toBe(
			'line L=9 θ=30° · nsr=auto · linear'
		);
		expect(describeRun({ method: 'rl', psf: { kind: 'disk', radius: 3 }, params: { iterations: 20, linearLight: false } })).toBe('disk r=3 · iterations=20 · sRGB');
	});
});

describe('drawn and image kernels in the form', () => {
	const path = { kind: 'path', points: [[0, 0], [6, 2], [9, 9]], weights: [6.3246, 15.2315] };

	it('a path spec in kernelJson is the spec sent, and the engine builds the same kernel', () => {
		const form = runFormSchema.parse({ kernelKind: 'path', kernelJson: JSON.stringify(path) });
		expect(kernelSpecOf(form)).toEqual(path);
		expect(Array.from(buildKernel(toNewRun(form).psf).data)).toEqual(Array.from(buildKernel(path as never).data));
		expect(newRunSchema.safeParse(toNewRun(form)).success).toBe(true);
	});

	it('an image kernel passes through with its origin', () => {
		const image = { kind: 'image', width: 3, height: 1, data: [0.25, 0.5, 0.25], origin: 'streak' };
		expect(kernelSpecOf(runFormSchema.parse({ kernelKind: 'image', kernelJson: JSON.stringify(image) }))).toEqual(image);
		expect(describeRun({ method: 'wiener', psf: image, params: {} })).toBe('image 3×1 (streak) · linear');
	});

	it.each([
		['', 'path', /Draw a path/],
		['{not json', 'path', /not valid JSON/],
		['{"kind":"path","points":[]}', 'path', /at least one point/],
		[JSON.stringify(path), 'image', /holds a path kernel/]
	] as const)('kernelJson %s for %s is refused on kernelJson with a clear message', (kernelJson, kernelKind, message) => {
		const parsed = runFormSchema.safeParse({ kernelKind, kernelJson });
		expect(parsed.success).toBe(false);
		expect(parsed.error!.issues[0].path).toEqual(['kernelJson']);
		expect(parsed.error!.issues[0].message).toMatch(message);
	});

	it('line, disk and gaussian ignore kernelJson; API messages about a drawn kernel land on kernelJson', () => {
		expect(runFormSchema.safeParse({ kernelKind: 'line', kernelJson: '{oops' }).success).toBe(true);
		expect(formFieldOf('psf.points.3.0')).toBe('kernelJson');
		expect(formFieldOf('psf')).toBeUndefined();
	});
});
