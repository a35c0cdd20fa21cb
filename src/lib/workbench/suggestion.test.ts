import { describe, expect, expectTypeOf, it } from 'vitest';
import type { EstimateJson } from '../server/services/estimate.service';
import { runFormSchema } from './run-form';
import {
	confidenceLabel,
	describeFill,
	describeKernel,
	describeRegion,
	formValuesOf,
	impliedNsr,
	noiseSummary,
	profilePolylines,
	requestRegion,
	sameRegion,
	type EstimateResponse
} from './suggestion';

describe('EstimateResponse', () => {
	it('is what the estimate service sends (checked by npm run check)', () => {
		expectTypeOf<EstimateJson>().toExtend<EstimateResponse>();
	});
});

describe('formValuesOf', () => {
	it('fills a straight-motion kernel on the form steps of 0.5 px and 0.5°', () => {
		expect(formValuesOf({ kind: 'line', length: 14.98, angleDeg: 19.75 })).toEqual({ kernelKind: 'line', length: 15, angleDeg: 20 });
		expect(formValuesOf({ kind: 'line', length: 9.2, angleDeg: 33.2 })).toEqual({ kernelKind: 'line', length: 9, angleDeg: 33 });
	});

	it('folds angles into the form range (−180°, 180°] and keeps a length of at least one step', () => {
		expect(formValuesOf({ kind: 'line', length: 0.1, angleDeg: 270 })).toEqual({ kernelKind: 'line', length: 0.5, angleDeg: -90 });
		expect(formValuesOf({ kind: 'line', length: 3, angleDeg: -180 })).toMatchObject({ angleDeg: 180 });
	});

	it('fills a disk radius on 0.25 px and a Gaussian sigma on 0.1 px', () => {
		expect(formValuesOf({ kind: 'disk', radius: 7.63 })).toEqual({ kernelKind: 'disk', radius: 7.75 });
		expect(formValuesOf({ kind: 'gaussian', sigma: 2.26 })).toEqual({ kernelKind: 'gaussian', sigma: 2.3 });
		expect(formValuesOf({ kind: 'gaussian', sigma: 0.02 })).toEqual({ kernelKind: 'gaussian', sigma: 0.1 });
	});

	it('gives values the run form accepts', () => {
		for (const kernel of [
			{ kind: 'line', length: 0.01, angleDeg: 359.9 },
			{ kind: 'disk', radius: 0.01 },
			{ kind: 'gaussian', sigma: 127.97 }
		] as const) {
			const parsed = runFormSchema.safeParse({ ...formValuesOf(kernel) });
			expect(parsed.success, JSON.stringify(kernel)).toBe(true);
		}
	});

	it('has no form values for kernels the number fields cannot hold', () => {
		expect(formValuesOf({ kind: 'path', points: [[0, 0], [3, 4]] })).toBeNull();
	});
});

describe('wording', () => {
	it('states the kernel in words and numbers, and what the form will receive', () => {
		const line = { kind: 'line', length: 14.98, angleDeg: 19.75 } as const;
		expect(describeKernel(line)).toBe('Straight motion 15.0 px at 19.8°');
		expect(describeKernel({ kind: 'disk', radius: 7.63 })).toBe('Defocus disk, radius 7.63 px');
		expect(describeFill(formValuesOf(line)!)).toBe('length 15 px, angle 20°');
	});

	it('labels confidence high from 0.8, moderate from 0.6, low below (our own thresholds)', () => {
		expect([0.96, 0.8, 0.79, 0.6, 0.59, 0].map(confidenceLabel)).toEqual(['high', 'high', 'moderate', 'moderate', 'low', 'low']);
	});

	it('names the analysed region', () => {
		expect(describeRegion({ x: 0, y: 0, width: 960, height: 640 }, { width: 960, height: 640 })).toBe('the whole image (960×640 px)');
		expect(describeRegion({ x: 100, y: 40, width: 256, height: 256 }, { width: 960, height: 640 })).toBe('a 256×256 px region at (100, 40)');
	});
});

describe('noise', () => {
	it('reports σ in percent of full scale, the reading it came from, and the NSR to 3 significant figures', () => {
		expect(noiseSummary({ immerkaer: 0.00308, mad: 0.00312, nsr: 0.00068437, sigma: 0.00308 })).toEqual({
			sigmaPercent: 0.308,
			estimator: 'Immerkær',
			nsr: 0.000684
		});
		expect(noiseSummary({ immerkaer: 0.005, mad: 0.004, nsr: null, sigma: 0.004 })).toMatchObject({ estimator: 'wavelet MAD', nsr: null });
	});

	it('has no summary or NSR when the answer carries none', () => {
		expect(noiseSummary({ immerkaer: null, mad: null, nsr: null, sigma: null })).toBeNull();
		expect(impliedNsr({ immerkaer: 0.01, mad: 0.01, nsr: 0, sigma: 0.01 })).toBeNull();
	});
});

describe('profilePolylines', () => {
	it('draws both curves on one vertical scale, lowest value at the bottom', () => {
		const { observed, model } = profilePolylines({ axis: 'radius', start: 3, observed: [0, 1, 2], model: [1, 1, 1] }, 100, 20, 0);
		expect(observed).toBe('0.0,20.0 50.0,10.0 100.0,0.0');
		expect(model).toBe('0.0,10.0 50.0,10.0 100.0,10.0');
	});
});

describe('requestRegion', () => {
	it('covers every whole pixel a fractional selection touches, and keeps null for the whole image', () => {
		expect(requestRegion({ x: 10.4, y: 3.6, width: 100.2, height: 50 })).toEqual({ x: 10, y: 3, width: 101, height: 51 });
		expect(requestRegion({ x: 5, y: 5, width: 0.2, height: 0.2 })).toEqual({ x: 5, y: 5, width: 1, height: 1 });
		expect(requestRegion(null)).toBeNull();
		expect(sameRegion(requestRegion({ x: 1, y: 2, width: 3, height: 4 }), { x: 1, y: 2, width: 3, height: 4 })).toBe(true);
		expect(sameRegion(null, { x: 0, y: 0, width: 1, height: 1 })).toBe(false);
	});
});
