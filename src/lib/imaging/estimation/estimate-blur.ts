import type { FftBackend } from '../fft/backend';
import type { KernelSpec } from '../kernels/spec';
import type { Plane } from '../types';
import { analysisBand, type AnalysisBand } from './band';
import { estimateDefocus } from './defocus';
import { estimateGaussianFalloff } from './gaussian';
import { estimateStraightMotion } from './motion';
import { estimateNoise, type NoiseEstimate } from './noise';
import { spectrumImage, type Overlay, type SpectrumImage } from './overlay';
import { assertRegion, cropRegion, regionView, type Region } from './region';
import { averagedPowerSpectrum, MIN_TILE_SIZE } from './spectrum';

/** How a proposal was read from the spectrum. */
export type EstimationMethod = 'spectral-lines' | 'spectral-rings' | 'spectral-falloff';

export interface BlurProposal {
	/** The kernel in the engine's JSON spec form, ready for buildKernel / a restoration run. */
	kernel: KernelSpec;
	/**
	 * Evidence in [0, 1]. Lines and rings: the correlation between the observed log-spectrum
	 * profile and the proposed kernel's zero pattern after the scene's smooth fall-off is removed
	 * (1 = the dark lines or rings sit exactly where the kernel predicts), times the share of the
	 * predicted zeros that are real dips (for lines also the depth agreement: the dark lines must be
	 * as deep as a line kernel's zeros make them, not a shallow ripple of the scene; for rings the
	 * share of directions in which the first ring is dark). Fall-off: at most 0.6, the share of the camera-only model's misfit the
	 * Gaussian explains, times its agreement past the band (a weaker kind of evidence).
	 */
	confidence: number;
	method: EstimationMethod;
	overlay: Overlay;
}

export type BlurVerdict = 'motion' | 'defocus' | 'gaussian' | 'no-confident-blur';

export interface BlurEstimate {
	/** Best first; empty when nothing reached its confidence threshold. */
	proposals: BlurProposal[];
	noise: NoiseEstimate;
	verdict: BlurVerdict;
	/** Plain-language notes: limits met, weak candidates, what was analysed. */
	notes: string[];
	/** The analysed spectrum (null when the region was too small or flat to compute one). */
	spectrum: SpectrumImage | null;
	/** The rectangle analysed, in image pixels. */
	region: Region;
}

/** Options of {@link estimateBlur}. */
export interface EstimateBlurOptions {
	/** Rectangle to analyse (blur often differs across a photo). @default the whole plane */
	region?: Region;
	/** Spectrum tile side, a power of two ≥ 64; lengths up to N/4 and radii up to N/8 are searched. @default 256 */
	tileSize?: number;
	/** Most tiles averaged into the spectrum; bounds the time on large photos. @default 48 */
	maxTiles?: number;
	/** Lines and rings below this confidence are not proposed. @default 0.5 */
	minConfidence?: number;
	/** A Gaussian fall-off below this confidence is not proposed. @default 0.3 */
	minGaussianConfidence?: number;
	/** A Gaussian narrower than this (pixels) is taken for the camera's own sharpness, not a blur. @default 1 */
	minGaussianSigma?: number;
	/** FFT implementation. @default the engine's default backend */
	fft?: FftBackend;
}

const round = (v: number, digits: number) => Math.round(v * 10 ** digits) / 10 ** digits;

/**
 * Longest side of the centred sample the noise is measured on: 2048² pixels give σ to well under
 * 1 % statistical error while keeping a 12-megapixel photo fast.
 */
const NOISE_SAMPLE_SIDE = 2048;

/**
 * A defocus fit on N-point tiles whose radius exceeds N/12 (rings under 7.3 bins out, 6 bins apart)
 * is repeated on 2N-point tiles, where the same rings lie twice as far apart and keep their depth
 * through the window's smoothing (Welch 1967: the periodogram's resolution is one bin of the tile).
 * Tuning constant, no source.
 */
const LARGE_RADIUS_SHARE = 1 / 12;
/**
 * The finer fit needs a region of at least 3·N on its short side (two half-overlapping 2N tiles per
 * side, four in all), and averages at most 16 tiles to bound the time. Tuning constants, no source.
 */
const FINE_REGION_TILES = 3;
const FINE_MAX_TILES = 16;

/** Variance below which a region is treated as flat: far under one 16-bit code value squared. */
const FLAT_VARIANCE = 1e-12;

function variance(plane: Plane): number {
	const d = plane.data;
	let sum = 0;
	let sumSq = 0;
	let finite = true;
	for (let i = 0; i < d.length; i++) {
		sum += d[i];
		sumSq += d[i] * d[i];
		if (!Number.isFinite(d[i])) finite = false;
	}
	if (!finite) return NaN;
	const mean = sum / d.length;
	return Math.max(0, sumSq / d.length - mean * mean);
}

function checkFraction(name: string, value: number): void {
	if (!(value >= 0 && value <= 1)) throw new RangeError(`${name} must lie in [0, 1], got ${value}`);
}

/**
 * Propose blur kernels for a region of a grey plane from the image alone, with the evidence for
 * each, and the noise level.
 * 1. Noise: Immerkær's σ and the wavelet MAD σ (estimateNoise) on the region's centre (at most
 *    2048×2048 pixels); the smaller sets the Wiener NSR and the spectrum's noise floor.
 * 2. Spectrum: Welch average of Hann-windowed N×N tiles (averagedPowerSpectrum); the band analysed
 *    ends where the ring-mean power drops to twice the noise power (analysisBand).
 * 3. Readings: straight motion from parallel dark lines (estimateStraightMotion), defocus from dark
 *    rings (estimateDefocus, on a band that runs to the last ring above the noise floor so that a
 *    ring sunk into the noise with a brighter lobe beyond it is kept, with the noise power
 *    subtracted), and, where neither is confident, a Gaussian from the fall-off
 *    (estimateGaussianFalloff, which must beat the power law seen through a Gaussian of
 *    minGaussianSigma, the camera's own sharpness). See each for the formulas and sources.
 * 4. Verdict: the most confident reading that reaches its threshold; otherwise 'no-confident-blur',
 *    with the weak candidates named in the notes. A kernel is never proposed silently: every
 *    proposal carries its confidence and the spectrum marks that justify it.
 * Never throws for flat, tiny or non-finite planes: they get 'no-confident-blur' and a note. Regions
 * smaller than 64×64 pixels are not analysed (too few spectral bins to place two dark lines).
 * @throws RangeError for a region outside the plane or invalid options.
 */
export function estimateBlur(plane: Plane, options: EstimateBlurOptions = {}): BlurEstimate {
	const minConfidence = options.minConfidence ?? 0.5;
	const minGaussianConfidence = options.minGaussianConfidence ?? 0.3;
	const minGaussianSigma = options.minGaussianSigma ?? 1;
	checkFraction('minConfidence', minConfidence);
	checkFraction('minGaussianConfidence', minGaussianConfidence);
	if (!(minGaussianSigma >= 0)) throw new RangeError(`minGaussianSigma must be ≥ 0, got ${minGaussianSigma}`);
	const [height, width] = plane.shape;
	const region = options.region ?? { x: 0, y: 0, width, height };
	assertRegion(region, height, width);
	const sampleWidth = Math.min(region.width, NOISE_SAMPLE_SIDE);
	const sampleHeight = Math.min(region.height, NOISE_SAMPLE_SIDE);
	const sample = cropRegion(plane, {
		x: region.x + ((region.width - sampleWidth) >> 1),
		y: region.y + ((region.height - sampleHeight) >> 1),
		width: sampleWidth,
		height: sampleHeight
	});
	const notes: string[] = [];
	const none = (noise: NoiseEstimate, note: string): BlurEstimate => ({
		proposals: [],
		noise,
		verdict: 'no-confident-blur',
		notes: [...notes, note],
		spectrum: null,
		region
	});

	const signalVariance = variance(sample);
	if (Number.isNaN(signalVariance)) {
		return none({ immerkaer: null, mad: null, nsr: null, sigma: null }, 'The region holds non-finite values (NaN or infinity); nothing was estimated.');
	}
	const noise = estimateNoise(sample);
	if (region.width < MIN_TILE_SIZE || region.height < MIN_TILE_SIZE) {
		return none(noise, `The region is ${region.width}×${region.height} pixels; blur estimation needs at least ${MIN_TILE_SIZE}×${MIN_TILE_SIZE}.`);
	}
	if (signalVariance < FLAT_VARIANCE) {
		return none(noise, 'The region is uniform: with no detail there is no spectrum to read a blur from.');
	}

	const spectrum = averagedPowerSpectrum(regionView(plane, region), { tileSize: options.tileSize, maxTiles: options.maxTiles ?? 48, fft: options.fft });
	const n = spectrum.size;
	let peak = 0;
	for (const p of spectrum.power) peak = Math.max(peak, p);
	// Exact zeros (noise-free synthetic input) would give −∞; a floor 15 decades under the peak keeps them finite.
	const logPower = spectrum.power.map((p) => Math.log(Math.max(p, peak * 1e-15)));
	const image = spectrumImage(logPower, n, spectrum.tiles);
	const sigma = noise.sigma ?? 0;
	const band: AnalysisBand = analysisBand(spectrum.power, n, sigma);
	notes.push(`Spectrum: ${spectrum.tiles} tile(s) of ${n}×${n} averaged; band ${band.rMin}–${band.rMax} bins of ${n / 2} (beyond it the noise dominates).`);

	const candidates: BlurProposal[] = [];
	const motion = estimateStraightMotion(logPower, n, band);
	if (motion) {
		candidates.push({
			kernel: { kind: 'line', length: round(motion.length, 2), angleDeg: round(motion.angleDeg, 2) },
			confidence: round(motion.confidence, 3),
			method: 'spectral-lines',
			overlay: {
				spectrum: image,
				marks: motion.marks,
				profile: motion.profile,
				caption: `Dark lines ${round(n / motion.length, 2)} bins apart across ${round(motion.angleDeg, 1)}° (${motion.zerosInBand} in band; cepstral peak at ${motion.cepstralLength === null ? 'none' : `${round(motion.cepstralLength, 2)} px`}).`
			}
		});
	}
	// Rings may sink into the noise with a brighter lobe beyond them: the defocus band runs to the last ring above the floor.
	const ringBand = analysisBand(spectrum.power, n, sigma, { edge: 'last' });
	let rings = { fit: estimateDefocus(logPower, n, ringBand, { noisePower: sigma * sigma }), n, band: ringBand };
	// Large disks put their rings close together on N-point tiles; where the region allows, the fit is
	// repeated on 2N-point tiles (Welch 1967: finer frequency bins) and the more confident reading kept.
	if (rings.fit && rings.fit.radius > LARGE_RADIUS_SHARE * n && Math.min(region.width, region.height) >= FINE_REGION_TILES * n) {
		const fine = averagedPowerSpectrum(regionView(plane, region), { tileSize: 2 * n, maxTiles: FINE_MAX_TILES, fft: options.fft });
		let finePeak = 0;
		for (const p of fine.power) finePeak = Math.max(finePeak, p);
		const fineLog = fine.power.map((p) => Math.log(Math.max(p, finePeak * 1e-15)));
		const fineBand = analysisBand(fine.power, fine.size, sigma, { edge: 'last' });
		const fineFit = estimateDefocus(fineLog, fine.size, fineBand, { noisePower: sigma * sigma });
		if (fineFit && fineFit.confidence > rings.fit.confidence) rings = { fit: fineFit, n: fine.size, band: fineBand };
	}
	const defocus = rings.fit;
	if (defocus) {
		// Marks are drawn on the N-point spectrum image: a ring of r bins on a 2N-point spectrum lies at r/2 there.
		const scale = n / rings.n;
		const marks = defocus.marks.map((m) => (m.kind === 'circle' ? { ...m, cx: m.cx * scale, cy: m.cy * scale, r: m.r * scale } : m));
		const tiles = rings.n === n ? '' : ` on ${rings.n}-point tiles`;
		candidates.push({
			kernel: { kind: 'disk', radius: round(defocus.radius, 2) },
			confidence: round(defocus.confidence, 3),
			method: 'spectral-rings',
			overlay: {
				spectrum: image,
				marks,
				profile: defocus.profile,
				caption: `First dark ring at ${round((0.6098 * rings.n) / defocus.radius, 1)} bins${tiles}: R = 0.6098·${rings.n}/k0 (${defocus.zerosInBand} ring(s) in band ${rings.band.rMin}–${rings.band.rMax}; first ring dark in ${Math.round(defocus.isotropy * 6)} of 6 directions).`
			}
		});
	}
	const zeroPattern = candidates.filter((c) => c.confidence >= minConfidence).sort((a, b) => b.confidence - a.confidence);
	for (const weak of candidates.filter((c) => c.confidence < minConfidence)) {
		notes.push(`Weak ${describe(weak.kernel)}: confidence ${weak.confidence} below ${minConfidence}; not proposed.`);
	}
	if (zeroPattern.length > 0) {
		return { proposals: zeroPattern, noise, verdict: zeroPattern[0].kernel.kind === 'line' ? 'motion' : 'defocus', notes, spectrum: image, region };
	}

	const gaussian = estimateGaussianFalloff(spectrum.power, n, band, sigma, { cameraSigma: minGaussianSigma });
	if (gaussian && gaussian.sigma >= minGaussianSigma && gaussian.confidence >= minGaussianConfidence) {
		notes.push('No spectral zeros were found; the Gaussian is read from the fall-off alone and is less certain than a line or ring reading.');
		const proposal: BlurProposal = {
			kernel: { kind: 'gaussian', sigma: round(gaussian.sigma, 2) },
			confidence: round(gaussian.confidence, 3),
			method: 'spectral-falloff',
			overlay: {
				spectrum: image,
				marks: gaussian.marks,
				profile: gaussian.profile,
				caption: `Fall-off fits exp(−2π²σ²ρ²) with σ = ${round(gaussian.sigma, 2)} px on a ρ^−${round(gaussian.powerLawExponent, 2)} scene spectrum.`
			}
		};
		return { proposals: [proposal], noise, verdict: 'gaussian', notes, spectrum: image, region };
	}
	if (gaussian) {
		notes.push(`Fall-off: Gaussian σ ${round(gaussian.sigma, 2)} px at confidence ${round(gaussian.confidence, 3)} (needs σ ≥ ${minGaussianSigma} px and confidence ≥ ${minGaussianConfidence}); not proposed.`);
	}
	notes.push('No confident blur: the spectrum shows no dark lines or rings a kernel would explain.');
	return { proposals: [], noise, verdict: 'no-confident-blur', notes, spectrum: image, region };
}

function describe(kernel: KernelSpec): string {
	if (kernel.kind === 'line') return `straight motion ${kernel.length} px at ${kernel.angleDeg}°`;
	if (kernel.kind === 'disk') return `defocus disk of radius ${kernel.radius} px`;
	return kernel.kind;
}
