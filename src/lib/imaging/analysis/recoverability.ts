import { nextPowerOfTwo } from '../fft/fast-size';
import type { Plane } from '../types';
import { transferFunction } from './transfer';

/** What the blur erased, for the report. */
export interface Recoverability {
	/** |H| below which a frequency counts as lost. */
	threshold: number;
	/** Share of the non-DC frequency grid with |H| below the threshold. */
	lostFraction: number;
	/**
	 * Directions (degrees CCW from +x on screen, in [0, 180), centres of 10° bins) along which detail
	 * is lost at the coarsest scale, worst first; empty when nothing is lost or every direction is
	 * hit alike (an isotropic blur).
	 */
	worstDirectionsDeg: number[];
	note: string;
}

export interface RecoverabilityOptions {
	/**
	 * Standard deviation of the sharp image's values; the threshold is where the Wiener gain
	 * |H|² / (|H|² + σ_n²/σ_x²) falls to ½. @default 0.2 (typical photograph on [0, 1], from memory)
	 */
	signalSigma?: number;
	/** Noise floor: 8-bit quantisation noise 1/(255·√12) (common practice, no source). @default 0.00113 */
	noiseFloor?: number;
}

/** Width of the direction bins in degrees. */
const BIN_DEG = 10;
/** Relative spread of first-loss frequencies treated as equal (tuning constant, no source). */
const ISOTROPY_TOLERANCE = 0.1;
/** Largest analysis grid side: the lost share is a density, so a 512-point sampling suffices. */
const MAX_GRID = 512;

/**
 * Which spatial frequencies the blur has effectively erased: those with |H(ρ)| < τ, τ = σ_n / σ_x,
 * where the Wiener filter passes less than half of the signal (N. Wiener, Extrapolation,
 * Interpolation, and Smoothing of Stationary Time Series, MIT Press 1949; Gonzalez & Woods, Digital
 * Image Processing, 4th ed., §5.8). Reports the lost share of the spectrum and the directions, in
 * the line-kernel angle convention, where loss starts at the lowest frequency: a straight motion at θ
 * has its first zero along φ at ρ = 1/(L·|cos(φ − θ)|) (Gonzalez & Woods §5.6), so it erases detail
 * varying along θ from the coarsest scale. (The lost share per direction is no ranking: a long blur
 * loses nearly all of a wide band of directions.) Directions are compared inside the disk ρ ≤ ½
 * cycles/pixel. The OTF is sampled on a power-of-two grid of at most 512 per side (at least twice the kernel).
 * @throws RangeError for a bad shape or a negative or non-finite noise sigma.
 */
export function recoverability(psf: Plane, shape: [number, number], noiseSigma: number, opts: RecoverabilityOptions = {}): Recoverability {
	const [h, w] = shape;
	if (!Number.isInteger(h) || !Number.isInteger(w) || h < 1 || w < 1) throw new RangeError(`shape must be positive integers, got ${h}×${w}`);
	if (!(noiseSigma >= 0) || !Number.isFinite(noiseSigma)) throw new RangeError(`noiseSigma must be finite and ≥ 0, got ${noiseSigma}`);
	const signalSigma = opts.signalSigma ?? 0.2;
	const floor = opts.noiseFloor ?? 1 / (255 * Math.sqrt(12));
	if (!(signalSigma > 0)) throw new RangeError(`signalSigma must be positive, got ${signalSigma}`);
	const threshold = Math.max(noiseSigma, floor) / signalSigma;
	const [kh, kw] = psf.shape;
	const grid = (n: number, k: number) => Math.max(nextPowerOfTwo(2 * k), Math.min(nextPowerOfTwo(n), MAX_GRID));
	const rows = grid(h, kh);
	const cols = grid(w, kw);
	const mag = transferFunction(psf, [rows, cols]).magnitude();
	const bins = Math.round(180 / BIN_DEG);
	/** Per direction bin: the lowest frequency ρ at which anything is lost. */
	const firstLost = new Float64Array(bins).fill(Infinity);
	let lost = 0;
	for (let k = 0; k < rows; k++) {
		const v = (k <= rows / 2 ? k : k - rows) / rows;
		for (let l = 0; l < cols; l++) {
			if (k === 0 && l === 0) continue;
			const u = (l <= cols / 2 ? l : l - cols) / cols;
			// Frequency vector on screen: +x right, +y up (image rows grow downwards).
			const angle = ((Math.atan2(-v, u) * 180) / Math.PI + 360) % 180;
			const bin = Math.min(bins - 1, Math.floor(angle / BIN_DEG));
			const isLost = mag[k * cols + l] < threshold;
			if (isLost) lost++;
			// Directions are compared inside the inscribed disk ρ ≤ ½ so the square grid's longer
			// diagonals do not bias them.
			const rho2 = u * u + v * v;
			if (isLost && rho2 <= 0.25 && rho2 < firstLost[bin] * firstLost[bin]) firstLost[bin] = Math.sqrt(rho2);
		}
	}
	const lostFraction = lost / (rows * cols - 1);
	const lowest = Math.min(...firstLost);
	// Bins whose loss starts within ISOTROPY_TOLERANCE of the earliest are "worst"; if that is
	// every bin, no direction stands out.
	const worst = Array.from(firstLost, (rho, b) => ({ deg: (b + 0.5) * BIN_DEG, rho }))
		.filter((d) => Number.isFinite(d.rho) && d.rho <= lowest * (1 + ISOTROPY_TOLERANCE))
		.sort((a, b) => a.rho - b.rho || a.deg - b.deg);
	const worstDirectionsDeg = worst.length < bins ? worst.slice(0, 3).map((d) => d.deg) : [];
	const pct = (lostFraction * 100).toFixed(1);
	const note =
		lost === 0
			? `No frequency falls below |H| = ${threshold.toPrecision(3)} at this noise level; restoration can in principle recover the full spectrum.`
			: `${pct}% of spatial frequencies have |H| below ${threshold.toPrecision(3)} (noise-tied threshold); ` +
				`they are not recovered, only regularised. ` +
				(worstDirectionsDeg.length
					? `Most affected detail varies along ${worstDirectionsDeg.map((d) => `${d}°`).join(', ')}.`
					: 'Every direction is affected alike.');
	return { threshold, lostFraction, worstDirectionsDeg, note };
}
