/** The region preview's restoration (see region-preview.ts); loaded only by the Web Worker (and the benchmark). */
import type { FftBackend } from '../imaging/fft/backend';
import { DefaultFftBackend } from '../imaging/fft/default-backend';
import { loadPffftBackend } from '../imaging/fft/pffft-loader';
import { restore } from '../imaging/restoration/restore';
import { createPlane } from '../imaging/types';
import { MAX_REGION_SIDE, type RegionAnswer, type RegionRequest } from './region-preview';

/**
 * The preview's FFT: PFFFT (WASM SIMD, 5-smooth sizes, so a 512² region pads to 640² rather than
 * 1024²) on the calling thread, or, when the WASM cannot be loaded (no SIMD, asset missing), the
 * engine's pure default (fft.js / ndarray-fft). The run record names whichever computed the preview.
 * The WASM file is found beside the package's script: in Node directly, in the browser through the
 * bundler (Vite rewrites the package's `new URL('pffft.wasm', import.meta.url)` to the emitted asset).
 */
export async function loadPreviewFft(): Promise<FftBackend> {
	try {
		return await loadPffftBackend();
	} catch {
		return new DefaultFftBackend();
	}
}

/**
 * Restore one RGBA crop with `restore`, as a full run would; failures come back as a reason, never a throw.
 * @param fft @default the engine's default backend
 */
export function previewRegion(request: RegionRequest, fft?: FftBackend): RegionAnswer {
	const { id, width, height, rgba } = request;
	if (width < 1 || height < 1 || width > MAX_REGION_SIDE || height > MAX_REGION_SIDE) {
		return { id, ok: false, error: `The region must be between 1 and ${MAX_REGION_SIDE} pixels on each side` };
	}
	const started = performance.now();
	try {
		const planes = [0, 1, 2].map((channel) => {
			const plane = createPlane(height, width);
			for (let i = 0; i < width * height; i++) plane.data[i] = rgba[4 * i + channel] / 255;
			return plane;
		});
		const { image, record } = restore({ width, height, planes, transfer: 'srgb', sourceBitDepth: 8 }, request.psf, request.options, fft ? { fft } : {});
		const out = new Uint8ClampedArray(width * height * 4);
		for (let i = 0; i < width * height; i++) {
			// Uint8ClampedArray clips to 0–255 itself: out-of-range values are shown as black or white, as in the full result's 8-bit preview.
			for (let channel = 0; channel < 3; channel++) out[4 * i + channel] = Math.round(image.planes[channel].data[i] * 255);
			out[4 * i + 3] = 255;
		}
		return { id, ok: true, width, height, rgba: out, ms: performance.now() - started, fft: record.padding.fft };
	} catch (err) {
		return { id, ok: false, error: (err as Error).message };
	}
}
