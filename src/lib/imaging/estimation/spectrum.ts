import type { FftBackend } from '../fft/backend';
import { defaultFftBackend } from '../fft/default-backend';
import { rfft2Buffer } from '../fft/real-fft';
import type { Plane } from '../types';

/** Smallest tile the spectral estimators accept: below it too few spectral zeros fit in the band. */
export const MIN_TILE_SIZE = 64;

/**
 * Averaged power spectrum of N×N tiles, centred: value (y, x) is the power at row frequency
 * (y − N/2)/N and column frequency (x − N/2)/N cycles per pixel, so screen directions in the
 * spectrum match screen directions in the image (x right, y down).
 */
export interface PowerSpectrum {
	size: number;
	power: Float64Array;
	tiles: number;
}

/** Options of {@link averagedPowerSpectrum}. */
export interface SpectrumOptions {
	/** Tile side N, a power of two; reduced to the largest power of two that fits the plane. @default 256 */
	tileSize?: number;
	/** Most tiles averaged; tiles are spread evenly over the plane when more would fit. @default 64 */
	maxTiles?: number;
	/** FFT implementation. @default the engine's default backend */
	fft?: FftBackend;
}

/** Evenly spread start positions of `count` tiles of `tile` pixels along an axis of `length`. */
function tileStarts(length: number, tile: number, count: number): number[] {
	if (count === 1) return [(length - tile) >> 1];
	return Array.from({ length: count }, (_, i) => Math.round((i * (length - tile)) / (count - 1)));
}

/** Separable Hann window w(n) = sin²(πn/N), n = 0 … N − 1 (periodic form, zero at the first sample). */
function hann(n: number): Float64Array {
	return Float64Array.from({ length: n }, (_, i) => Math.sin((Math.PI * i) / n) ** 2);
}

/**
 * Welch's averaged modified periodogram of a plane: P = Σ_tiles |DFT(w · (tile − mean))|² /
 * (tiles · Σ w²), with w the separable Hann window and tiles overlapping by half. Averaging keeps
 * the blur's spectral zeros (common to every tile) while the scene's own spectrum averages out;
 * the window removes the cross that the frame edges would otherwise draw through the spectrum.
 * The normalisation makes white noise of variance σ² read P = σ² at every frequency, so the noise
 * estimate gives the spectrum's floor directly.
 * @see P. D. Welch, "The use of fast Fourier transform for the estimation of power spectra",
 *   IEEE Trans. Audio Electroacoustics 15(2):70–73, 1967, doi:10.1109/TAU.1967.1161901;
 *   M. Cannon, "Blind deconvolution of spatially invariant image blurs with phase", IEEE Trans.
 *   ASSP 24(1):58–63, 1976, doi:10.1109/TASSP.1976.1162770 (averaging sub-image spectra to find
 *   blur zeros); F. J. Harris, "On the use of windows for harmonic analysis with the discrete
 *   Fourier transform", Proc. IEEE 66(1):51–83, 1978, doi:10.1109/PROC.1978.10837 (Hann window).
 * @throws RangeError when the plane is smaller than MIN_TILE_SIZE on a side, or for a tile size
 *   that is not a power of two ≥ MIN_TILE_SIZE, or maxTiles < 1.
 */
export function averagedPowerSpectrum(plane: Plane, options: SpectrumOptions = {}): PowerSpectrum {
	const [height, width] = plane.shape;
	const requested = options.tileSize ?? 256;
	const maxTiles = options.maxTiles ?? 64;
	if (!Number.isInteger(requested) || requested < MIN_TILE_SIZE || (requested & (requested - 1)) !== 0) {
		throw new RangeError(`tile size must be a power of two ≥ ${MIN_TILE_SIZE}, got ${requested}`);
	}
	if (!Number.isInteger(maxTiles) || maxTiles < 1) throw new RangeError(`maxTiles must be a positive integer, got ${maxTiles}`);
	if (Math.min(height, width) < MIN_TILE_SIZE) {
		throw new RangeError(`spectrum needs at least ${MIN_TILE_SIZE}×${MIN_TILE_SIZE} pixels, got ${width}×${height}`);
	}
	let n = requested;
	while (n > Math.min(height, width)) n /= 2;
	const backend = options.fft ?? defaultFftBackend();

	let across = Math.floor((width - n) / (n / 2)) + 1;
	let down = Math.floor((height - n) / (n / 2)) + 1;
	if (across * down > maxTiles) {
		const shrink = Math.sqrt(maxTiles / (across * down));
		across = Math.max(1, Math.floor(across * shrink));
		down = Math.max(1, Math.floor(down * shrink));
	}
	const window1d = hann(n);
	let windowPower = 0;
	for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) windowPower += (window1d[i] * window1d[j]) ** 2;

	const half = n / 2 + 1;
	const halfPower = new Float64Array(n * half);
	const tile = new Float64Array(n * n);
	const [s0, s1] = plane.stride;
	const src = plane.data;
	for (const top of tileStarts(height, n, down)) {
		for (const left of tileStarts(width, n, across)) {
			let mean = 0;
			for (let i = 0; i < n; i++) {
				const base = plane.offset + (top + i) * s0 + left * s1;
				for (let j = 0; j < n; j++) mean += tile[i * n + j] = src[base + j * s1];
			}
			mean /= n * n;
			for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) tile[i * n + j] = (tile[i * n + j] - mean) * window1d[i] * window1d[j];
			const { data } = rfft2Buffer(tile, n, n, backend);
			for (let k = 0; k < halfPower.length; k++) halfPower[k] += data[2 * k] ** 2 + data[2 * k + 1] ** 2;
		}
	}
	const tiles = across * down;
	const scale = 1 / (tiles * windowPower);
	const power = new Float64Array(n * n);
	for (let k = 0; k < n; k++) {
		const y = (k + n / 2) % n;
		const mirrorRow = (n - k) % n;
		for (let l = 0; l < n; l++) {
			// Columns past N/2 come from Hermitian symmetry, P(k, l) = P(−k, −l).
			const value = l < half ? halfPower[k * half + l] : halfPower[mirrorRow * half + (n - l)];
			power[y * n + ((l + n / 2) % n)] = value * scale;
		}
	}
	return { size: n, power, tiles };
}
