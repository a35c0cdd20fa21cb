import ndarray from 'ndarray';
import { psnr, restore, ssim, toSrgb, type FftBackend, type KernelSpec, type RasterImage, type RestoreOptions } from '../src/lib/imaging';
import type { SynthImage } from './image';
import type { SynthKernel } from './kernels';

/** The bridge between benchmark data and the engine under test: conversions and metrics only. */
export function toRaster(img: SynthImage): RasterImage {
	return {
		width: img.width,
		height: img.height,
		planes: img.planes.map((p) => ndarray(p, [img.height, img.width])),
		transfer: 'srgb',
		sourceBitDepth: 16
	};
}

export function fromRaster(img: RasterImage): SynthImage {
	const srgb = img.transfer === 'srgb' ? img : toSrgb(img);
	return {
		width: srgb.width,
		height: srgb.height,
		planes: srgb.planes.map((p) => {
			const out = new Float32Array(srgb.width * srgb.height);
			for (let y = 0, i = 0; y < srgb.height; y++) for (let x = 0; x < srgb.width; x++, i++) out[i] = p.get(y, x);
			return out;
		})
	};
}

/** The true kernel as the engine receives it: an explicit `image` spec of the very same weights. */
export function kernelSpecOf(k: SynthKernel): KernelSpec {
	return { kind: 'image', width: k.size, height: k.size, data: Array.from(k.data) };
}

/** `ms` includes the benchmark's own conversions; `restoreMs` is the engine call alone. */
export function runEngine(img: SynthImage, k: SynthKernel, options: RestoreOptions, fft?: FftBackend) {
	const t0 = performance.now();
	const raster = toRaster(img);
	const t1 = performance.now();
	const { image, record } = restore(raster, kernelSpecOf(k), options, fft ? { fft } : {});
	const restoreMs = performance.now() - t1;
	return { output: fromRaster(image), record, ms: performance.now() - t0, restoreMs };
}

export interface Quality {
	psnr: number;
	ssim: number;
}

/**
 * PSNR and SSIM (Wang et al., IEEE TIP 2004) from the engine's metrics module, on values
 * clamped to [0, 1] as any stored file would be, averaged over channels; `border` px are
 * left out on every side when given.
 */
export function quality(result: SynthImage, truth: SynthImage, border = 0): Quality {
	const w = truth.width - 2 * border;
	const h = truth.height - 2 * border;
	let p = 0;
	let s = 0;
	truth.planes.forEach((t, c) => {
		const a = new Float32Array(w * h);
		const b = new Float32Array(w * h);
		for (let y = 0; y < h; y++) {
			for (let x = 0; x < w; x++) {
				const i = (y + border) * truth.width + x + border;
				a[y * w + x] = Math.min(1, Math.max(0, result.planes[c][i]));
				b[y * w + x] = t[i];
			}
		}
		p += psnr(ndarray(a, [h, w]), ndarray(b, [h, w]), 1);
		s += ssim(ndarray(a, [h, w]), ndarray(b, [h, w]));
	});
	return { psnr: p / truth.planes.length, ssim: s / truth.planes.length };
}
