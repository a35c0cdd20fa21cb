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
