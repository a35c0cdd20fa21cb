/**
 * The workbench's spectrum panel (issue 5): the log power spectrum of the image the technician is
 * looking at, with the proposed kernel's transfer-function zeros and its erased (|H| < t) region
 * drawn over it, so a wrong angle or length shows as lines that miss the dark bands.
 *
 * Pure: RGBA bytes, planes and kernel specs in, arrays and marks out. The panel and its Web Worker
 * import it; the numbers come from the engine (spectrum, transfer function, recoverability), so
 * the panel shows what the restoration and the report use, not a second estimate.
 */
import { recoverability, type Recoverability } from '../imaging/analysis/recoverability';
import { transferFunction } from '../imaging/analysis/transfer';
import { srgbToLinear } from '../imaging/colour';
import { besselJ1Zeros } from '../imaging/estimation/bessel';
import { spectrumImage, type OverlayMark, type SpectrumImage } from '../imaging/estimation/overlay';
import { averagedPowerSpectrum } from '../imaging/estimation/spectrum';
import { nextPowerOfTwo } from '../imaging/fft/fast-size';
import { buildKernel } from '../imaging/kernels/build';
import type { KernelSpec } from '../imaging/kernels/spec';
import { createPlane, type Plane } from '../imaging/types';
import { kernelAtScale } from './region-preview';
import { DEFAULT_SPECTRUM_SIZE, spectrumSize } from './spectrum-size';

/** Zero lines closer than this (in bins) would paint the panel solid; they are left out and the caption says so. */
export const MIN_LINE_SPACING = 2;

/**
 * Luminance weights of linear sRGB (ITU-R BT.709 primaries, as used by IEC 61966-2-1; from memory):
 * Y = 0.2126·R + 0.7152·G + 0.0722·B.
 */
const LUMA_WEIGHTS = [0.2126, 0.7152, 0.0722] as const;

/**
 * Linear-light luminance of 8-bit sRGB RGBA pixels (as a canvas's getImageData returns them):
 * blur is linear in light, so the spectral zeros are exact only after the sRGB decode
 * (IEC 61966-2-1:1999 §5.2; Tai et al., IEEE TPAMI 35(10), 2013, doi:10.1109/TPAMI.2012.266),
 * which is also where the engine deconvolves by default.
 * @throws RangeError when the buffer does not hold width·height RGBA pixels.
 */
export function linearLuminanceFromRgba(rgba: Uint8ClampedArray, width: number, height: number): Plane {
	if (rgba.length !== 4 * width * height) throw new RangeError(`RGBA buffer holds ${rgba.length} bytes, expected 4·${width}·${height}`);
	const decode = Float32Array.from({ length: 256 }, (_, code) => srgbToLinear(code / 255));
	const plane = createPlane(height, width);
	const [wr, wg, wb] = LUMA_WEIGHTS;
	for (let i = 0; i < width * height; i++) {
		plane.data[i] = wr * decode[rgba[4 * i]] + wg * decode[rgba[4 * i + 1]] + wb * decode[rgba[4 * i + 2]];
	}
	return plane;
}

/**
 * Log power spectrum of the centred N×N square of a plane, scaled to [0, 1] for display, zero
 * frequency at pixel (N/2, N/2). One Hann-windowed tile of the engine's Welch estimator
 * (averagedPowerSpectrum with one tile takes the centred square), so the frame edges draw no
 * cross through the spectrum (Harris, Proc. IEEE 66(1):51–83, 1978, doi:10.1109/PROC.1978.10837).
 * @throws RangeError when the plane is smaller than N on a side or N is not a power of two ≥ 64.
 */
export function viewSpectrum(luminance: Plane, n = DEFAULT_SPECTRUM_SIZE): SpectrumImage {
	const [height, width] = luminance.shape;
	if (spectrumSize(width, height, n) !== n) throw new RangeError(`a ${n}×${n} spectrum needs a plane at least that large, got ${width}×${height}`);
	const spectrum = averagedPowerSpectrum(luminance, { tileSize: n, maxTiles: 1 });
	let peak = 0;
	for (const p of spectrum.power) peak = Math.max(peak, p);
	// A flat or noise-free square has exact zeros (log → −∞); a floor 15 decades under the peak keeps them finite.
	const logPower = spectrum.power.map((p) => Math.log(Math.max(p, peak * 1e-15, Number.MIN_VALUE)));
	return spectrumImage(logPower, n, spectrum.tiles);
}

/** What the panel draws over the spectrum for one kernel. */
export interface KernelOverlay {
	size: number;
	/** The kernel as applied to this image (scaled with kernelAtScale). */
	kernel: KernelSpec;
	/** 1 where |H| < recoverability.threshold, row-major N×N, centred like the spectrum image. */
	lost: Uint8Array;
	/** Threshold, lost share and worst directions, as the run report states them. */
	recoverability: Recoverability;
	/** Analytic zeros in the spectrum image's pixels (zero frequency at N/2): lines of a `line` kernel, the first ring of a `disk`. */
	marks: OverlayMark[];
	/** One line saying what the marks are, or why there are none. */
	caption: string;
}

export interface KernelOverlayOptions {
	/** Image pixels per original pixel; the kernel is shrunk to match. @default 1 */
	scale?: number;
	/** Noise σ of the image on [0, 1]; sets the recoverability threshold. @default 0 (the 8-bit quantisation floor) */
	noiseSigma?: number;
}

/**
 * |H| of a kernel on the centred N×N grid of the spectrum image. A kernel wider than N is
 * transformed on a larger power-of-two grid M and every (M/N)-th sample kept: the same
 * frequencies k/N cycles/pixel, sampled from the kernel's DTFT without wrapping it.
 */
function centredMagnitude(psf: Plane, n: number): Float64Array {
	const m = Math.max(n, nextPowerOfTwo(Math.max(...psf.shape)));
	const step = m / n;
	const magnitude = transferFunction(psf, [m, m]).magnitude();
	const out = new Float64Array(n * n);
	for (let y = 0; y < n; y++) {
		const row = ((y - n / 2 + n) % n) * step;
		for (let x = 0; x < n; x++) out[y * n + x] = magnitude[row * m + ((x - n / 2 + n) % n) * step];
	}
	return out;
}

/**
 * Lines {p : (p − c)·d = s} for s = ±k·spacing, k = 1, 2, …, clipped to the square [0, N]²,
 * where d is a unit vector in the spectrum image's pixels (Liang–Barsky clipping of each line's
 * parametrisation c + s·d + t·d⊥).
 */
function perpendicularLines(n: number, d: { x: number; y: number }, spacing: number): OverlayMark[] {
	const c = n / 2;
	const across = { x: -d.y, y: d.x };
	const marks: OverlayMark[] = [];
	for (let k = 1; k * spacing < c * Math.SQRT2; k++) {
		for (const s of [k * spacing, -k * spacing]) {
			const foot = { x: c + s * d.x, y: c + s * d.y };
			let lo = -Infinity;
			let hi = Infinity;
			for (const [p, q] of [
				[foot.x, across.x],
				[foot.y, across.y]
			]) {
				if (Math.abs(q) < 1e-12) {
					if (p < 0 || p > n) lo = Infinity;
					continue;
				}
				const [a, b] = [(0 - p) / q, (n - p) / q].sort((u, v) => u - v);
				lo = Math.max(lo, a);
				hi = Math.min(hi, b);
			}
			if (lo < hi) marks.push({ kind: 'segment', role: 'zero', x1: foot.x + lo * across.x, y1: foot.y + lo * across.y, x2: foot.x + hi * across.x, y2: foot.y + hi * across.y });
		}
	}
	return marks;
}

/**
 * The analytic zeros of a kernel on an N-bin spectrum.
 * - `line` of length L at θ: H(ω) = sin(πL ω·d)/(L sin(π ω·d)) vanishes where ω·d = k/L, i.e. on lines
 *   perpendicular to the motion d at k·N/L bins from the centre (Gonzalez & Woods, Digital Image
 *   Processing, 4th ed., Pearson 2018, §5.6). d is (cos θ, −sin θ) in image pixels, whose y points
 *   down like the spectrum image's.
 * - `disk` of radius R: 2·J1(2πRρ)/(2πRρ) first vanishes at ρ = 3.8317/(2πR) cycles/pixel, a ring
 *   of 3.8317·N/(2πR) bins (Cannon, IEEE Trans. ASSP 24(1):58–63, 1976, doi:10.1109/TASSP.1976.1162770).
 * - Other kinds have no closed-form zeros; only the |H| < t shading shows them.
 */
export function analyticZeros(kernel: KernelSpec, n: number): { marks: OverlayMark[]; caption: string } {
	const c = n / 2;
	if (kernel.kind === 'line') {
		const spacing = n / kernel.length;
		if (spacing < MIN_LINE_SPACING) return { marks: [], caption: `Zero lines would be ${spacing.toFixed(2)} bins apart, too dense to draw at ${n}×${n}.` };
		const theta = (kernel.angleDeg * Math.PI) / 180;
		return {
			marks: perpendicularLines(n, { x: Math.cos(theta), y: -Math.sin(theta) }, spacing),
			caption: `Predicted dark lines every ${spacing.toFixed(1)} bins (N/L), perpendicular to ${kernel.angleDeg}°.`
		};
	}
	if (kernel.kind === 'disk') {
		const r = (besselJ1Zeros(1)[0] * n) / (2 * Math.PI * kernel.radius);
		return { marks: [{ kind: 'circle', role: 'zero', cx: c, cy: c, r }], caption: `Predicted first dark ring at ${r.toFixed(1)} bins (3.8317·N/2πR).` };
	}
	return { marks: [], caption: `A ${kernel.kind} kernel has no closed-form zeros; the shading shows where |H| is below the threshold.` };
}

/**
 * Everything the panel draws for one kernel on an N×N spectrum: the erased-frequency mask
 * (|H| < t with recoverability's noise-tied threshold t, on the spectrum's own grid), the lost
 * share and worst directions from recoverability (the figures the run report gives), and the
 * analytic zeros of the kernel as applied at `scale`.
 * @throws RangeError for an invalid kernel, scale or noise σ (messages from the engine).
 */
export function kernelOverlay(spec: KernelSpec, n: number, options: KernelOverlayOptions = {}): KernelOverlay {
	const scale = options.scale ?? 1;
	if (!(scale > 0) || !Number.isFinite(scale)) throw new RangeError(`scale must be a positive finite number, got ${scale}`);
	const kernel = kernelAtScale(spec, scale);
	const psf = buildKernel(kernel);
	const report = recoverability(psf, [n, n], options.noiseSigma ?? 0);
	const magnitude = centredMagnitude(psf, n);
	const lost = Uint8Array.from(magnitude, (h) => (h < report.threshold ? 1 : 0));
	return { size: n, kernel, lost, recoverability: report, ...analyticZeros(kernel, n) };
}

/** A message to the panel's Web Worker: the spectrum of new pixels, or the overlay of a kernel. */
export type SpectrumRequest =
	| { kind: 'spectrum'; id: number; n: number; width: number; height: number; rgba: Uint8ClampedArray }
	| { kind: 'overlay'; id: number; n: number; spec: KernelSpec; scale: number; noiseSigma: number };

export type SpectrumAnswer =
	| { kind: 'spectrum'; id: number; ok: true; image: SpectrumImage; ms: number }
	| { kind: 'overlay'; id: number; ok: true; overlay: KernelOverlay; ms: number }
	| { kind: SpectrumRequest['kind']; id: number; ok: false; error: string };

/** Answer one worker request, timed; failures come back as a reason, never a throw. */
export function answerSpectrumRequest(request: SpectrumRequest): SpectrumAnswer {
	const started = performance.now();
	try {
		if (request.kind === 'spectrum') {
			const image = viewSpectrum(linearLuminanceFromRgba(request.rgba, request.width, request.height), request.n);
			return { kind: 'spectrum', id: request.id, ok: true, image, ms: performance.now() - started };
		}
		const overlay = kernelOverlay(request.spec, request.n, { scale: request.scale, noiseSigma: request.noiseSigma });
		return { kind: 'overlay', id: request.id, ok: true, overlay, ms: performance.now() - started };
	} catch (err) {
		return { kind: request.kind, id: request.id, ok: false, error: (err as Error).message };
	}
}
