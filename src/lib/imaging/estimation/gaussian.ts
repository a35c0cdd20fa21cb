import type { AnalysisBand } from './band';
import { bandMarks, type FitProfile, type OverlayMark } from './overlay';
import { radialMean } from './radial-profile';

/** A Gaussian-blur reading of a spectrum (see {@link estimateGaussianFalloff}). */
export interface GaussianEstimate {
	/** Standard deviation σ of the Gaussian PSF, pixels; 0 when the fall-off shows no Gaussian term. */
	sigma: number;
	/** Exponent α of the scene's power law P ∝ ρ^−α fitted alongside. */
	powerLawExponent: number;
	/**
	 * Evidence in [0, GAUSSIAN_CONFIDENCE_CAP]: the cap times the share of the null model's squared
	 * misfit that the fitted Gaussian removes (the null model being the power law seen through the
	 * camera's own σ0, options.cameraSigma; 0 when σ ≤ σ0), times tailAgreement.
	 */
	confidence: number;
	/**
	 * How well the fit explains the rings past the band, where the power has sunk to the noise:
	 * min(1, (predicted + 0.1·σ²) / observed) for the mean power above the noise there. A Gaussian
	 * blur leaves almost nothing above the noise past its band edge; a scene that merely holds
	 * little fine detail keeps a slowly fading tail there. 1 when there is no such tail to check.
	 */
	tailAgreement: number;
	profile: FitProfile;
	marks: OverlayMark[];
}

/**
 * Highest confidence a Gaussian reading can reach: without spectral zeros, a Gaussian fall-off
 * cannot be told apart for certain from a scene that simply holds little fine detail.
 */
export const GAUSSIAN_CONFIDENCE_CAP = 0.6;

/**
 * Allowance, in units of σ², for the mean power above the noise past the band that the fit does
 * not predict: a 2.5 % error of the noise σ (about what estimateNoise reaches on textured scenes)
 * moves the noise power by 5 %; twice that is allowed. Tuning constant, no source.
 */
const TAIL_TOLERANCE = 0.1;

/** Options of {@link estimateGaussianFalloff}. */
export interface GaussianOptions {
	/**
	 * σ0 of the camera's own sharpness (lens, sensor, demosaicing), pixels: the null model the
	 * Gaussian must beat is the scene's power law seen through a Gaussian of this σ0, so that a
	 * scene that merely holds little fine detail is not read as a blur. @default 0 (a pure power law)
	 */
	cameraSigma?: number;
}

/** Share of the Nyquist radius up to which the tail is checked (the corners alias; see band.ts). */
const OUTER_SHARE = 0.9;

/** Least squares of y on the given columns; returns the coefficients and the residual sum of squares. */
function leastSquares(columns: Float64Array[], y: Float64Array): { coef: number[]; ssr: number } {
	const k = columns.length;
	const a = Array.from({ length: k }, (_, i) => Array.from({ length: k + 1 }, (_, j) => {
		const other = j < k ? columns[j] : y;
		let s = 0;
		for (let t = 0; t < y.length; t++) s += columns[i][t] * other[t];
		return s;
	}));
	// Gauss–Jordan elimination with partial pivoting on the normal equations (k ≤ 3).
	for (let col = 0; col < k; col++) {
		let pivot = col;
		for (let row = col + 1; row < k; row++) if (Math.abs(a[row][col]) > Math.abs(a[pivot][col])) pivot = row;
		[a[col], a[pivot]] = [a[pivot], a[col]];
		for (let row = 0; row < k; row++) {
			if (row === col || a[col][col] === 0) continue;
			const f = a[row][col] / a[col][col];
			for (let j = col; j <= k; j++) a[row][j] -= f * a[col][j];
		}
	}
	const coef = a.map((row, i) => (row[i] !== 0 ? row[k] / row[i] : 0));
	let ssr = 0;
	for (let t = 0; t < y.length; t++) {
		let fitted = 0;
		for (let i = 0; i < k; i++) fitted += coef[i] * columns[i][t];
		ssr += (y[t] - fitted) ** 2;
	}
	return { coef, ssr };
}

/**
 * Mean power above the noise on the rings past the band, observed against the fitted model's
 * prediction (ring-area weighted, rMax < r ≤ 0.9·N/2), as min(1, (predicted + TAIL_TOLERANCE·σ²) /
 * observed); 1 without noise or without rings past the band.
 */
function tailCheck(power: Float64Array, n: number, rMax: number, noisePower: number, predicted: (r: number) => number): number {
	const outer = Math.floor(OUTER_SHARE * (n / 2));
	if (!(noisePower > 0) || rMax >= outer) return 1;
	const ring = radialMean(power, n, outer);
	let observedSum = 0;
	let predictedSum = 0;
	let weight = 0;
	for (let r = rMax + 1; r <= outer; r++) {
		observedSum += r * (ring[r] - noisePower);
		predictedSum += r * predicted(r);
		weight += r;
	}
	const observed = observedSum / weight;
	const allowed = predictedSum / weight + TAIL_TOLERANCE * noisePower;
	return observed > allowed ? allowed / observed : 1;
}

/**
 * Estimate an isotropic Gaussian blur from the ring-averaged power spectrum where the blur has no
 * zeros. With the scene's spectrum modelled as a power law (natural images: P ∝ ρ^−α, α ≈ 2) and
 * the Gaussian's H(ρ) = exp(−2π²σ²ρ²), the noise-free power obeys
 * ln(P̄(ρ) − σ_n²) = a − α·ln ρ − 4π²σ²·ρ², fitted by least squares over the band (ρ = r/N cycles per
 * pixel), so σ = √(−c / 4π²) from the ρ² coefficient c (σ = 0 when c ≥ 0). The noise power σ_n² is
 * subtracted first, since the floor would otherwise bend the fall-off and bias σ low.
 * Evidence, two checks against a scene that merely holds little fine detail:
 * 1. Nested models: the null model is the power law seen through the camera's own Gaussian of σ0
 *    (options.cameraSigma), the ρ² coefficient fixed at −4π²σ0²; the share of its residual sum of
 *    squares that the free σ removes, 1 − SSR(σ)/SSR(σ0), is the extra-sum-of-squares comparison
 *    of nested least-squares fits (N. R. Draper & H. Smith, Applied Regression Analysis, 3rd ed.,
 *    1998, §6.1, from memory). It is 0 when σ ≤ σ0.
 * 2. Tail: a Gaussian leaves nothing measurable above the noise past the band, so mean excess power
 *    there beyond the fit's prediction (plus 0.1·σ²) scales the confidence down (tailAgreement): a
 *    scene's own fine detail fades slowly into the noise, a Gaussian blur's spectrum drops into it.
 * @see Gonzalez & Woods, Digital Image Processing, 4th ed., 2018, §4.8 (Gaussian transfer function);
 *   D. J. Field, "Relations between the statistics of natural images and the response properties of
 *   cortical cells", J. Opt. Soc. Am. A 4(12):2379–2394, 1987, doi:10.1364/JOSAA.4.002379 (power-law
 *   spectra; DOI from memory).
 * @returns null when fewer than 8 consecutive rings from the band's inner edge stand above the noise.
 * @throws RangeError for a map that is not N×N or a negative noise σ.
 */
export function estimateGaussianFalloff(power: Float64Array, n: number, band: AnalysisBand, noiseSigma: number, options: GaussianOptions = {}): GaussianEstimate | null {
	if (power.length !== n * n) throw new RangeError(`map holds ${power.length} values, expected ${n}×${n}`);
	if (!(noiseSigma >= 0)) throw new RangeError(`noise σ must be ≥ 0, got ${noiseSigma}`);
	const cameraSigma = options.cameraSigma ?? 0;
	if (!(cameraSigma >= 0) || !Number.isFinite(cameraSigma)) throw new RangeError(`camera σ must be finite and ≥ 0, got ${cameraSigma}`);
	const ring = radialMean(power, n, band.rMax);
	const floor = noiseSigma * noiseSigma;
	const rs: number[] = [];
	for (let r = band.rMin; r <= band.rMax && ring[r] > floor; r++) rs.push(r);
	if (rs.length < 8) return null;
	const rho = Float64Array.from(rs, (r) => r / n);
	const y = Float64Array.from(rs, (r) => Math.log(ring[r] - floor));
	const one = rho.map(() => 1);
	const logRho = rho.map(Math.log);
	const rho2 = rho.map((p) => p * p);
	const withGaussian = leastSquares([one, logRho, rho2], y);
	const c = withGaussian.coef[2];
	const sigma = c < 0 ? Math.sqrt(-c / (4 * Math.PI * Math.PI)) : 0;
	const model = Float64Array.from(rho, (p, i) => withGaussian.coef[0] + withGaussian.coef[1] * logRho[i] + c * p * p);
	// The null model: the power law seen through the camera's own Gaussian of σ0 (a fixed ρ² term).
	const camera = leastSquares([one, logRho], y.map((v, i) => v + 4 * Math.PI * Math.PI * cameraSigma * cameraSigma * rho2[i]));
	const explained = sigma > cameraSigma && camera.ssr > 0 ? Math.max(0, 1 - withGaussian.ssr / camera.ssr) : 0;
	const tailAgreement = tailCheck(power, n, band.rMax, floor, (r) => Math.exp(withGaussian.coef[0] + withGaussian.coef[1] * Math.log(r / n) + (c * r * r) / (n * n)));
	const marks = bandMarks(n, band.rMin, band.rMax);
	if (sigma > 0) {
		// |H| = ½ where 2π²σ²ρ² = ln 2.
		const halfRadius = (Math.sqrt(Math.LN2 / 2) / (Math.PI * sigma)) * n;
		marks.unshift({ kind: 'circle', role: 'half-transfer', cx: n / 2, cy: n / 2, r: halfRadius });
	}
	return {
		sigma,
		powerLawExponent: -withGaussian.coef[1],
		confidence: sigma > 0 ? GAUSSIAN_CONFIDENCE_CAP * explained * tailAgreement : 0,
		tailAgreement,
		profile: { axis: 'radius', start: band.rMin, observed: Float32Array.from(y), model: Float32Array.from(model) },
		marks
	};
}
