import { describe, expect, it } from 'vitest';
import { recoverability } from '../imaging/analysis/recoverability';
import { transferFunction } from '../imaging/analysis/transfer';
import { buildKernel } from '../imaging/kernels/build';
import type { KernelSpec } from '../imaging/kernels/spec';
import type { OverlayMark } from '../imaging/estimation/overlay';
import { seededRandom } from '../imaging/random';
import { createPlane } from '../imaging/types';
import { MIN_TILE_SIZE } from '../imaging/estimation/spectrum';
import { MIN_SPECTRUM_SIZE, spectrumSize } from './spectrum-size';
import { answerSpectrumRequest, kernelOverlay, linearLuminanceFromRgba, viewSpectrum } from './spectrum-view';

const N = 256;
const C = N / 2;
type Segment = Extract<OverlayMark, { kind: 'segment' }>;

/** |H| of a kernel as the engine computes it, moved so zero frequency sits at (N/2, N/2). */
function engineMagnitudeCentred(spec: KernelSpec, n: number): Float64Array {
	const mag = transferFunction(buildKernel(spec), [n, n]).magnitude();
	return Float64Array.from({ length: n * n }, (_, i) => mag[((Math.floor(i / n) + n / 2) % n) * n + (((i % n) + n / 2) % n)]);
}

/** Bilinear sample of a centred N×N map at (x, y) pixels. */
function sample(map: Float64Array, n: number, x: number, y: number): number {
	const x0 = Math.floor(x);
	const y0 = Math.floor(y);
	const fx = x - x0;
	const fy = y - y0;
	const at = (i: number, j: number) => map[j * n + i];
	return (1 - fy) * ((1 - fx) * at(x0, y0) + fx * at(x0 + 1, y0)) + fy * ((1 - fx) * at(x0, y0 + 1) + fx * at(x0 + 1, y0 + 1));
}

/** Distances (bins, along the motion) of the local minima of |H| on the ray from the centre along d. */
function minimaAlong(map: Float64Array, n: number, d: { x: number; y: number }, reach: number): number[] {
	const step = 0.05;
	const values = Array.from({ length: Math.floor(reach / step) }, (_, i) => sample(map, n, C + i * step * d.x, C + i * step * d.y));
	const minima: number[] = [];
	for (let i = 1; i < values.length - 1; i++) if (values[i] < values[i - 1] && values[i] <= values[i + 1]) minima.push(i * step);
	return minima;
}

/** Signed distance of a segment's line from the centre along unit d, and its direction's cosine with d. */
function lineGeometry(mark: Segment, d: { x: number; y: number }) {
	const length = Math.hypot(mark.x2 - mark.x1, mark.y2 - mark.y1);
	return {
		offset: (mark.x1 - C) * d.x + (mark.y1 - C) * d.y,
		cosWithMotion: ((mark.x2 - mark.x1) * d.x + (mark.y2 - mark.y1) * d.y) / length
	};
}

describe('kernelOverlay: zero lines of a straight kernel', () => {
	it.each([8, 16])('L = %i on N = 256: lines at every multiple of N/L, on minima of the engine’s |H| (Gonzalez & Woods §5.6)', (L) => {
		const spec: KernelSpec = { kind: 'line', length: L, angleDeg: 0 };
		const overlay = kernelOverlay(spec, N);
		const segments = overlay.marks.filter((m): m is Segment => m.kind === 'segment');
		const along = { x: 1, y: 0 };
		const offsets = segments.map((m) => lineGeometry(m, along).offset).sort((a, b) => a - b);
		// Zeros of |sin(πkL/N) / (L·sin(πk/N))| (Gonzalez & Woods, Digital Image Processing, 4th ed., §5.6): k = j·N/L, inside |k| ≤ N/2.
		const expected = Array.from({ length: L + 1 }, (_, i) => (i - L / 2) * (N / L)).filter((s) => s !== 0);
		expect(offsets.length).toBe(expected.length);
		offsets.forEach((s, i) => expect(s).toBeCloseTo(expected[i], 9));
		for (const m of segments) expect(Math.abs(lineGeometry(m, along).cosWithMotion)).toBeLessThan(1e-9);

		// The engine's |H| along the motion axis: a minimum, and ≈ 0, at each predicted line.
		const mag = engineMagnitudeCentred(spec, N);
		const minima = minimaAlong(mag, N, along, C - 1);
		const predicted = expected.filter((s) => s > 0 && s < C - 1);
		expect(minima.length).toBe(predicted.length);
		predicted.forEach((s, i) => expect(minima[i]).toBeCloseTo(s, 6));
		for (const s of predicted) {
			expect(mag[C * N + C + s]).toBeLessThan(1e-6);
			expect(overlay.lost[C * N + C + s]).toBe(1);
		}
	});

	it('the lines turn with the kernel: a 30° kernel’s lines are perpendicular to 30° and lie on the engine’s minima', () => {
		const L = 16;
		const spec: KernelSpec = { kind: 'line', length: L, angleDeg: 30 };
		const theta = Math.PI / 6;
		// Screen angle θ CCW from +x with image y down: direction (cos θ, −sin θ) in pixels (kernels/spec.ts convention).
		const motion = { x: Math.cos(theta), y: -Math.sin(theta) };
		const segments = kernelOverlay(spec, N).marks.filter((m): m is Segment => m.kind === 'segment');
		expect(segments.length).toBeGreaterThan(0);
		for (const m of segments) {
			const { offset, cosWithMotion } = lineGeometry(m, motion);
			expect(Math.abs(cosWithMotion)).toBeLessThan(1e-9);
			const k = offset / (N / L);
			expect(Math.abs(k - Math.round(k))).toBeLessThan(1e-9);
			expect(Math.round(k)).not.toBe(0);
		}
		const mag = engineMagnitudeCentred(spec, N);
		// The anti-aliased 30° kernel is not an exact box, so its minima sit near, not on, k·N/L (±1 bin, common practice, no source).
		const minima = minimaAlong(mag, N, motion, 3.5 * (N / L));
		expect(minima.length).toBe(3);
		minima.forEach((s, i) => expect(Math.abs(s - (i + 1) * (N / L))).toBeLessThan(1));
		for (const s of minima) expect(sample(mag, N, C + s * motion.x, C + s * motion.y)).toBeLessThan(0.05);
		// Across the motion the thin line blurs little (|H| stays above ½ over the same reach): no dark band
		// there, so lines drawn at a wrong angle cross bright spectrum.
		const across = Array.from({ length: 57 }, (_, s) => sample(mag, N, C - s * motion.y, C + s * motion.x));
		expect(Math.min(...across)).toBeGreaterThan(0.5);
	});

	it('uses the kernel at the image’s scale: L = 32 on a half-size image draws the L = 16 lines', () => {
		const half = kernelOverlay({ kind: 'line', length: 32, angleDeg: 0 }, N, { scale: 0.5 });
		const full = kernelOverlay({ kind: 'line', length: 16, angleDeg: 0 }, N);
		expect(half.kernel).toEqual({ kind: 'line', length: 16, angleDeg: 0 });
		expect(half.marks).toEqual(full.marks);
	});

	it('leaves out lines closer than 2 bins and says so', () => {
		const dense = kernelOverlay({ kind: 'line', length: 200, angleDeg: 0 }, N);
		expect(dense.marks).toEqual([]);
		expect(dense.caption).toMatch(/too dense/);
	});
});

describe('kernelOverlay: defocus ring', () => {
	it('disk R: first dark ring at 3.8317·N/(2πR) bins, on the engine’s first minimum (Cannon 1976)', () => {
		for (const R of [4, 6]) {
			const [ring] = kernelOverlay({ kind: 'disk', radius: R }, N).marks;
			// M. Cannon, IEEE Trans. ASSP 24(1):58–63, 1976, doi:10.1109/TASSP.1976.1162770: first zero of 2·J1(x)/x at x = 3.8317.
			const expected = (3.8317 * N) / (2 * Math.PI * R);
			expect(ring).toMatchObject({ kind: 'circle', role: 'zero', cx: C, cy: C });
			expect(ring.kind === 'circle' && Math.abs(ring.r / expected - 1)).toBeLessThan(1e-4);
			const [first] = minimaAlong(engineMagnitudeCentred({ kind: 'disk', radius: R }, N), N, { x: 1, y: 0 }, C - 1);
			expect(Math.abs(first - expected)).toBeLessThan(1);
		}
	});
});

describe('kernelOverlay: erased-frequency mask', () => {
	it.each<KernelSpec>([
		{ kind: 'line', length: 15, angleDeg: 30 },
		{ kind: 'disk', radius: 5 },
		{ kind: 'gaussian', sigma: 2 }
	])('its share of the non-DC grid equals recoverability’s lost fraction (%o)', (spec) => {
		const overlay = kernelOverlay(spec, N, { noiseSigma: 0.01 });
		const report = recoverability(buildKernel(spec), [N, N], 0.01);
		const lost = overlay.lost.reduce((sum, v) => sum + v, 0) - overlay.lost[C * N + C];
		expect(report.lostFraction).toBeGreaterThan(0);
		expect(lost / (N * N - 1)).toBe(report.lostFraction);
		expect(overlay.recoverability).toEqual(report);
	});

	it('grows with the noise, as the threshold is tied to it', () => {
		const spec: KernelSpec = { kind: 'line', length: 9, angleDeg: 0 };
		const count = (sigma: number) => kernelOverlay(spec, N, { noiseSigma: sigma }).lost.reduce((s, v) => s + v, 0);
		expect(count(0.02)).toBeGreaterThan(count(0.002));
	});

	it('a kernel wider than N is sampled from a finer grid, not refused', () => {
		const overlay = kernelOverlay({ kind: 'line', length: 100, angleDeg: 0 }, 64);
		expect(overlay.lost.length).toBe(64 * 64);
		expect(overlay.lost[32 * 64 + 32]).toBe(0);
	});
});

describe('viewSpectrum', () => {
	it('shows a horizontal blur’s zeros as dark columns at multiples of N/L (Gonzalez & Woods §5.6)', () => {
		const L = 16;
		const random = seededRandom(7);
		const sharp = Float32Array.from({ length: N * N }, () => random());
		const psf = buildKernel({ kind: 'line', length: L, angleDeg: 0 });
		const [kh, kw] = psf.shape;
		const row = (kh - 1) / 2;
		const half = (kw - 1) / 2;
		const blurred = createPlane(N, N);
		for (let y = 0; y < N; y++) {
			for (let x = 0; x < N; x++) {
				let sum = 0;
				for (let j = 0; j < kw; j++) sum += psf.get(row, j) * sharp[y * N + ((x - j + half + N) % N)];
				blurred.data[y * N + x] = sum;
			}
		}
		const image = viewSpectrum(blurred, N);
		expect([image.width, image.height, image.centre.x, image.centre.y]).toEqual([N, N, C, C]);
		const column = (x: number) => {
			let sum = 0;
			for (let y = 0; y < N; y++) sum += image.data[y * N + x];
			return sum / N;
		};
		for (const k of [1, 2, 3]) {
			for (const sign of [1, -1]) {
				const zero = C + sign * k * (N / L);
				// The window spreads each zero over ±1 bin; the columns half-way to the next zero are the peaks.
				expect(column(zero)).toBeLessThan(column(zero + (sign * N) / (2 * L)) - 0.1);
			}
		}
		for (const v of image.data) expect(v >= 0 && v <= 1).toBe(true);
	});

	it('refuses a plane smaller than N', () => {
		expect(() => viewSpectrum(createPlane(100, 300), 128)).toThrow(RangeError);
	});
});

describe('spectrumSize', () => {
	it('takes the largest power of two that fits, down to 64, else null', () => {
		expect(spectrumSize(1000, 900)).toBe(256);
		expect(spectrumSize(1000, 900, 512)).toBe(512);
		expect(spectrumSize(300, 200)).toBe(128);
		expect(spectrumSize(64, 64)).toBe(64);
		expect(spectrumSize(500, 63)).toBeNull();
		expect(() => spectrumSize(500, 500, 300)).toThrow(RangeError);
		expect(MIN_SPECTRUM_SIZE).toBe(MIN_TILE_SIZE);
	});
});

describe('linearLuminanceFromRgba', () => {
	it('decodes sRGB and weights R, G, B by 0.2126, 0.7152, 0.0722', () => {
		const rgba = new Uint8ClampedArray([255, 255, 255, 255, 0, 255, 0, 255, 128, 128, 128, 255]);
		const plane = linearLuminanceFromRgba(rgba, 3, 1);
		expect(plane.data[0]).toBeCloseTo(1, 6);
		// BT.709 green weight (ITU-R BT.709-6 Table 3 item 3.3; from memory).
		expect(plane.data[1]).toBeCloseTo(0.7152, 6);
		// IEC 61966-2-1:1999 §5.2: ((128/255 + 0.055)/1.055)^2.4 = 0.21586.
		expect(plane.data[2]).toBeCloseTo(0.21586, 4);
		expect(() => linearLuminanceFromRgba(rgba, 2, 2)).toThrow(RangeError);
	});
});

describe('answerSpectrumRequest', () => {
	it('answers both kinds of request with the id and a time, and turns a failure into a reason', () => {
		const rgba = new Uint8ClampedArray(64 * 64 * 4).map((_, i) => (i % 4 === 3 ? 255 : (i * 37) % 256));
		const spectrum = answerSpectrumRequest({ kind: 'spectrum', id: 3, n: 64, width: 64, height: 64, rgba });
		expect(spectrum).toMatchObject({ kind: 'spectrum', id: 3, ok: true, image: { width: 64 } });
		const overlay = answerSpectrumRequest({ kind: 'overlay', id: 4, n: 64, spec: { kind: 'disk', radius: 3 }, scale: 1, noiseSigma: 0 });
		expect(overlay).toMatchObject({ kind: 'overlay', id: 4, ok: true, overlay: { size: 64 } });
		expect(overlay.ok && overlay.ms).toBeGreaterThanOrEqual(0);
		const bad = answerSpectrumRequest({ kind: 'overlay', id: 5, n: 64, spec: { kind: 'disk', radius: -1 }, scale: 1, noiseSigma: 0 });
		expect(bad).toMatchObject({ kind: 'overlay', id: 5, ok: false, error: expect.stringContaining('radius') });
	});
});
