/**
 * The live region preview (issue 5 §5): a crop of the displayed preview restored in the browser
 * by the same engine call the worker makes for a full run (`restore`), so what the technician
 * sees is the method itself, only smaller. This module is light (the page imports it); the
 * restoration itself is in region-restore.ts, which only the Web Worker loads.
 */
import type { KernelSpec } from '../imaging/kernels/spec';
import type { RestoreOptions } from '../imaging/restoration/restore';
import type { NewRun } from '../schemas/run';

/** Largest side of a previewed region: a 1024² Wiener stays interactive on an ordinary laptop. */
export const MAX_REGION_SIDE = 1024;
/** Richardson–Lucy previews stop here: enough to judge the kernel, short enough to refresh while typing. */
export const PREVIEW_ITERATIONS = 15;

export interface RegionRequest {
	id: number;
	width: number;
	height: number;
	/** RGBA, 8-bit sRGB, as a canvas's getImageData returns it. */
	rgba: Uint8ClampedArray;
	psf: KernelSpec;
	options: RestoreOptions;
}

export type RegionAnswer =
	| { id: number; ok: true; width: number; height: number; rgba: Uint8ClampedArray; ms: number; /** FFT backend that computed it (run-record name). */ fft: string }
	| { id: number; ok: false; error: string };

/**
 * The preview shows the image at `scale` of its original size (preview ≤ 2048 px), so a kernel
 * measured in original pixels is shrunk by the same factor before it is applied to the preview.
 */
export function kernelAtScale(spec: KernelSpec, scale: number): KernelSpec {
	if (scale >= 1) return spec;
	switch (spec.kind) {
		case 'line':
			return { ...spec, length: spec.length * scale };
		case 'disk':
			return { ...spec, radius: spec.radius * scale };
		case 'gaussian':
			return { ...spec, sigma: spec.sigma * scale };
		case 'path':
			return { ...spec, points: spec.points.map(([x, y]) => [x * scale, y * scale] as [number, number]) };
		default:
			return spec;
	}
}

/** Engine options for a preview of the run the form describes; RL is cut to PREVIEW_ITERATIONS. */
export function previewOptions(run: NewRun): RestoreOptions {
	const params = { ...run.params } as RestoreOptions & Record<string, unknown>;
	if ((run.method === 'rl' || run.method === 'rltv') && (params.iterations ?? 30) > PREVIEW_ITERATIONS) params.iterations = PREVIEW_ITERATIONS;
	return { ...params, method: run.method };
}
