import type { Plane } from '../types';
import { diskKernel } from './disk';
import { centreExplicitKernel } from './explicit';
import { gaussianKernel } from './gaussian';
import { lineKernel } from './line';
import { pathKernel } from './path';
import type { KernelSpec } from './spec';

/**
 * Rasterise a kernel spec: odd-sized, centred, normalised to sum 1 (see each kind's builder for its
 * sampling and anti-aliasing). The same spec always yields the same Float32 values.
 * @throws RangeError for values outside the engine's bounds (validate untrusted JSON with
 *   kernelSpecSchema first for field-level messages).
 */
export function buildKernel(spec: KernelSpec): Plane {
	switch (spec.kind) {
		case 'line':
			return lineKernel(spec.length, spec.angleDeg);
		case 'path':
			return pathKernel(spec.points, { weights: spec.weights, smooth: spec.smooth });
		case 'disk':
			return diskKernel(spec.radius);
		case 'gaussian':
			return gaussianKernel(spec.sigma);
		case 'image':
			if (!Number.isInteger(spec.width) || !Number.isInteger(spec.height) || spec.width < 1 || spec.height < 1) {
				throw new RangeError(`image kernel size must be positive integers, got ${spec.width}×${spec.height}`);
			}
			return centreExplicitKernel(spec.data, spec.height, spec.width);
		default:
			throw new RangeError(`unknown kernel kind ${(spec as { kind: unknown }).kind}`);
	}
}
