import type { AnalysisBand } from './band';
import { besselJ1Zeros, jinc } from './bessel';
import { dipCount } from './dips';
import { NuisanceProjector, residualCorrelation } from './nuisance';
import { bandMarks, fitProfile, type FitProfile, type OverlayMark } from './overlay';
import { radialMean, sectorMeans } from './radial-profile';

/** A defocus reading of a spectrum (see {@link estimateDefocus}). */
export interface DefocusEstimate {
	/** Disk radius R in pixels. */
	radius: number;
	/** Evidence in [0, 1]: max(0, correlation) · dips · isotropy; 0 when the ring ratio disagrees or the fit sits on the search's edge. */
	confidence: number;
	/** Share of the first (at most three) dark rings inside the band that are real dips of the ring profile (see dipCount). */
	dips: number;
	/** Share of the angular sectors in which the first dark ring is a real dip: a disk darkens the whole ring. */
	isotropy: number;
	/**
	 * Measured radius of a dark ring over the previous one's, for the first pair located at least
	 * 10 bins out (first pair, J1 zeros: 7.0156/3.8317 = 1.831); null when no pair is in band.
	 */
	ringRatio: number | null;
	/** Correlation of the ring profile with the model's, trend removed, in [−1, 1]. */
	correlation: number;
	/** Dark rings of the proposed disk inside the analysed band. */
	zerosInBand: number;
	profile: FitProfile;
	marks: OverlayMark[];
}

/** Options of {@link estimateDefocus}. */
export interface DefocusOptions {
	/** Smallest radius searched, pixels. @default 1 */
	minRadius?: number;
	/** Largest radius searched, pixels; at most N/8, so the first ring lies ≥ 4.9 bins out. @default N/8 */
	maxRadius?: number;
	/**
	 * White-noise power σ² of the spectrum (a Welch spectrum normalised as in averagedPowerSpectrum
	 * reads σ² at every frequency). It is subtracted from the ring means before the logarithm, so
	 * that rings near the noise floor keep their depth. @default 0
	 */
	noisePower?: number;
}

/** Depth floors δ of the model ln(jinc² + δ) (see motion.ts for why several are tried). */
const MODEL_FLOORS = [0.003, 0.01, 0.03, 0.1];
const FINE_STEP = 0.005;
const BESSEL_ZEROS = besselJ1Zeros(20);
const [FIRST_ZERO, SECOND_ZERO] = BESSEL_ZEROS;
/** Angular sectors of the half plane in which the first ring must show (see the isotropy test). */
const SECTORS = 6;
/**
 * Least noise-free power trusted after subtracting the noise, as a share of σ²: the ring means of a
 * Welch spectrum scatter by a few per cent of σ², so a difference below 0.1·σ² is not a measured
 * depth. Tuning constant, no source.
 */
const NOISE_DEPTH = 0.1;

/**
 * Least depth of a dark ring below the lobe middles on both sides, natural-log units of power:
 * 0.8 ≈ 3.5 dB. Measured on the synthetic cases of the tests and benchmark, real rings after the
 * noise is subtracted are 1.2–6 deep over the whole ring (0.8 in the worst single sector), while
 * the ring-like undulations of sharp scenes (text strokes, a power law's curvature) reach 0.1–0.9
 * and are not consistent across rings and sectors. Tuning constant, no source.
 */
const RING_MARGIN = 0.8;

/**
 * Largest relative difference between the measured spacing of two consecutive rings and the
 * spacing the Bessel zeros predict from the inner one, r_k·(z_{k+1}/z_k − 1). Measured disks of the
 * tests and benchmark (first pair, z_2/z_1 = 1.831) read ratios 1.79–1.90, spacing errors −5 … +8 %;
 * rings of a sinc pattern (equally spaced zeros, ratio 2, as the strokes of text can produce) are
 * 20 % off. Tuning constant, no source.
 */
const SPACING_TOLERANCE = 0.12;

/**
 * Innermost radius, bins, at which a ring is located or tested per sector: a 30° sector (and its
 * opposite) holds about r samples per ring, so from 10 bins on each sector ring mean averages ten
 * or more. Common practice, no source.
 */
const MIN_RING_BINS = 10;

/** Sub-samples per bin of the radial smoothing in {@link ringWeights}. */
const SUB = 8;

/**
 * Radial smoothing that the measurement applies to the spectrum, at offsets t = −2 … 2 bins: the
 * ring means split every sample linearly between its two nearest rings (a triangle of half-width
 * one bin), and the expected Welch periodogram is the true spectrum convolved with the window's
 * power kernel, for the Hann window |W|² = (1/6, 2/3, 1/6) on neighbouring bins (Welch 1967;
 * D. B. Percival & A. T. Walden, Spectral Analysis for Physical Applications, 1993, §6.4, from
 * memory). K(t) = ⅔·tri(t) + ⅙·tri(t − 1) + ⅙·tri(t + 1).
 */
const SMOOTHING = Float64Array.from({ length: 4 * SUB + 1 }, (_, j) => {
	const t = j / SUB - 2;
	const tri = (u: number) => Math.max(0, 1 - Math.abs(u));
	return (2 / 3) * tri(t) + (1 / 6) * tri(t - 1) + (1 / 6) * tri(t + 1);
});

/**
 * Normalised weights of the sub-samples r' = r + t around each ring r: SMOOTHING(t) times the
 * number of frequency samples at radius r' (∝ r') times the scene's power law r'^−α, which makes
 * the smoothing lean towards the brighter inner side of every ring.
 */
function ringWeights(rs: Float64Array, alpha: number): Float64Array[] {
	return Array.from(rs, (r) => {
		const w = SMOOTHING.map((k, j) => {
			const at = r + j / SUB - 2;
			return at > 0 ? k * at ** (1 - alpha) : 0;
		});
		const total = w.reduce((a, b) => a + b, 0);
		return w.map((v) => v / total);
	});
}

/**
 * Ring means of a disk's power |2J1(x)/x|², x = 2πR·r'/N, smoothed as the measurement smooths them
 * (ringWeights), over ring radii rs (bins).
 */
function smoothedDiskPower(radius: number, n: number, rs: Float64Array, weights: Float64Array[]): Float64Array {
	const scale = (2 * Math.PI * radius) / n;
	return rs.map((r, i) => {
		const w = weights[i];
		let sum = 0;
		for (let j = 0; j < w.length; j++) if (w[j] > 0) sum += w[j] * jinc(scale * (r + j / SUB - 2)) ** 2;
		return sum;
	});
}

/**
 * The first pair of consecutive dark rings k, k + 1 whose search windows (±30 % of the ring spacing
 * around the predicted radii) start at least MIN_RING_BINS out and end inside the profile, each
 * located at the profile's minimum in its window (refined by a parabola through it and its
 * neighbours); null when no pair qualifies.
 */
function locateRingPair(profile: Float64Array, first: number, zeros: number[]): { k: number; inner: number; outer: number } | null {
	const locate = (k: number): number | null => {
		const lo = Math.ceil(zeros[k] - 0.3 * (zeros[k] - (k > 0 ? zeros[k - 1] : 0)) - first);
		const hi = Math.floor(zeros[k] + 0.3 * (zeros[k + 1] - zeros[k]) - first);
		if (lo < 1 || lo + first < MIN_RING_BINS || hi > profile.length - 2 || hi < lo) return null;
		let at = lo;
		for (let i = lo + 1; i <= hi; i++) if (profile[i] < profile[at]) at = i;
		const [a, b, c] = [profile[at - 1], profile[at], profile[at + 1]];
		const curvature = a - 2 * b + c;
		return first + at + (curvature > 0 ? (0.5 * (a - c)) / curvature : 0);
	};
	for (let k = 0; k + 2 < zeros.length && zeros[k] <= first + profile.length; k++) {
		const inner = locate(k);
		if (inner === null) continue;
		const outer = locate(k + 1);
		return outer === null ? null : { k, inner, outer };
	}
	return null;
}

/** Power-law exponent α of a log profile y(r) ≈ a − α·ln r (least squares), limited to [0, 4]. */
function powerLawExponent(y: Float64Array, rs: Float64Array): number {
	const logs = rs.map(Math.log);
	const mx = logs.reduce((a, b) => a + b, 0) / logs.length;
	const my = y.reduce((a, b) => a + b, 0) / y.length;
	let sxy = 0;
	let sxx = 0;
	for (let i = 0; i < y.length; i++) {
		sxy += (logs[i] - mx) * (y[i] - my);
		sxx += (logs[i] - mx) ** 2;
	}
	return Math.min(4, Math.max(0, -sxy / sxx));
}

/** ln(max(P̄(r) − σ², NOISE_DEPTH·σ²)) over the radii rs of a ring-mean power profile (ln P̄ when σ² = 0). */
function signalLog(mean: Float64Array, rs: Float64Array, noisePower: number): Float64Array {
	return rs.map((r) => Math.log(noisePower > 0 ? Math.max(mean[r] - noisePower, NOISE_DEPTH * noisePower) : mean[r]));
}

/**
 * Estimate a uniform defocus disk from a centred log power spectrum. The disk's transfer function
 * 2·J1(2πRρ)/(2πRρ) vanishes on rings at ρ = z_k/(2πR), z_1 = 3.8317, z_2 = 7.0156, so the first
 * dark ring at k0 bins of an N-point spectrum gives R = 0.6098·N/k0 (Cannon 1976).
 * 1. Profile: the power (a Welch average over windowed tiles, which lowers the variance of the
 *    periodogram; Welch 1967) is averaged over rings one bin wide, the noise power σ² is
 *    subtracted, and the logarithm taken (floored at 0.1·σ²). Subtracting the noise keeps a ring
 *    that sinks into the noise floor as deep as it is, with its brighter outer lobe beyond it.
 * 2. Fit: over the band, with a trend a + b·ln r + c·r + d·ln²r removed (the scene's fall-off: a
 *    power law whose exponent may drift with frequency), the profile is correlated with the
 *    trend-free model ln(K∗(2J1(x)/x)² + δ), x = 2πR·r/N, over a grid of R and δ, then R is
 *    refined. K is the radial smoothing the measurement itself applies (the Hann window's power
 *    kernel and the ring means' linear split, leaning towards the brighter inner side of each ring
 *    by the scene's r^−α); without it the fitted rings sit a few tenths of a bin outwards and R
 *    reads low by up to 1 % (measured on the benchmark, R = 15 px: 14.88 → 15.01).
 * 3. Evidence: the first (up to three) predicted rings inside the band must be real dips of the
 *    profile, darker than the lobe middles on both sides by 0.8 (natural log of power; dipCount,
 *    rule 'both'). The first ring must also be such a dip in each of six angular sectors, since
 *    defocus darkens the whole ring while a scene's own texture, a line blur or a periodic pattern
 *    darkens some directions only. confidence = max(0, correlation) · (dips passed / dips tested)
 *    · (sectors passed / 6).
 * 4. Ring ratio: where the first two rings are both in band (larger R; for small R the second ring
 *    lies in the noise and the sector test carries the evidence), their measured radii must stand
 *    in the ratio of the Bessel zeros, z_2/z_1 = 7.0156/3.8317 = 1.831, within 5 %; otherwise the
 *    confidence is 0. Equally spaced dark rings (ratio 2, a sinc pattern) are not a disk.
 * Only radii whose band reaches past the first ring to the top of the second lobe (midway between
 * the first two zeros) are searched: a ring whose far side is not seen is just a fall-off. A best
 * fit on that smallest radius earns no confidence (the optimum may lie outside the search).
 * @see M. Cannon, "Blind deconvolution of spatially invariant image blurs with phase", IEEE Trans.
 *   ASSP 24(1):58–63, 1976, doi:10.1109/TASSP.1976.1162770 (zeros of the defocus transfer function);
 *   P. D. Welch, "The use of fast Fourier transform for the estimation of power spectra", IEEE
 *   Trans. Audio Electroacoustics 15(2):70–73, 1967, doi:10.1109/TAU.1967.1161901 (averaged
 *   periodogram); M. Abramowitz & I. A. Stegun, Handbook of Mathematical Functions, 1964,
 *   Table 9.5 (zeros of J1).
 * @returns null when the band is narrower than 8 bins or cannot show a ring of any admissible radius.
 * @throws RangeError for a map that is not N×N or invalid options.
 */
export function estimateDefocus(logPower: Float64Array, n: number, band: AnalysisBand, options: DefocusOptions = {}): DefocusEstimate | null {
	if (logPower.length !== n * n) throw new RangeError(`map holds ${logPower.length} values, expected ${n}×${n}`);
	const minRadius = options.minRadius ?? 1;
	const maxRadius = Math.min(options.maxRadius ?? n / 8, n / 8);
	const noisePower = options.noisePower ?? 0;
	if (!(minRadius > 0) || !(maxRadius > minRadius)) throw new RangeError(`need 0 < minRadius < maxRadius ≤ N/8, got ${minRadius}, ${maxRadius}`);
	if (!(noisePower >= 0) || !Number.isFinite(noisePower)) throw new RangeError(`noise power must be finite and ≥ 0, got ${noisePower}`);
	const { rMin, rMax } = band;
	if (rMax - rMin < 8) return null;
	const smallest = Math.max(minRadius, (((FIRST_ZERO + SECOND_ZERO) / 2) * n) / (2 * Math.PI * rMax));
	if (smallest > maxRadius) return null;

	const power = logPower.map(Math.exp);
	const rs = Float64Array.from({ length: rMax - rMin + 1 }, (_, i) => rMin + i);
	const trend = new NuisanceProjector([rs.map(() => 1), rs.map(Math.log), rs, rs.map((r) => Math.log(r) ** 2)]);
	const logSignal = signalLog(radialMean(power, n, rMax), rs, noisePower);
	const observed = trend.residual(logSignal);
	const weights = ringWeights(rs, powerLawExponent(logSignal, rs));
	const model = (disk: Float64Array, floor: number) => trend.residual(disk.map((p) => Math.log(p + floor)));

	let best = { r: -Infinity, radius: smallest, floor: MODEL_FLOORS[0] };
	// Geometric steps that move the outermost ring by at most 0.4 bin (see motion.ts).
	for (let radius = smallest; radius <= maxRadius + 1e-9; radius *= 1 + 0.4 / rMax) {
		const disk = smoothedDiskPower(radius, n, rs, weights);
		for (const floor of MODEL_FLOORS) {
			const r = residualCorrelation(observed, model(disk, floor));
			if (r > best.r) best = { r, radius, floor };
		}
	}
	const reach = (best.radius * 0.8) / rMax;
	for (let radius = Math.max(smallest, best.radius - reach); radius <= Math.min(maxRadius, best.radius + reach) + 1e-9; radius += FINE_STEP) {
		const r = residualCorrelation(observed, model(smoothedDiskPower(radius, n, rs, weights), best.floor));
		if (r > best.r) best = { ...best, r, radius };
	}

	// A best fit on the smallest admissible radius places its ring at the band's edge: the true optimum
	// may lie outside the search, so the ring is not located and earns no confidence.
	const pinned = smallest > minRadius && best.radius <= smallest + FINE_STEP;
	const zeroRadii = BESSEL_ZEROS.map((z) => (z * n) / (2 * Math.PI * best.radius));
	const rings = dipCount(observed, rMin, zeroRadii, 3, 'both', RING_MARGIN);
	const dips = rings.tested > 0 ? rings.passed / rings.tested : 0;
	// Sectors are tested on the first ring whose inner lobe middle lies MIN_RING_BINS or more out, or
	// on the first ring in band when no such ring is (a short band, noise-limited).
	const outward = Math.max(0, Math.min(rs.length - 2, MIN_RING_BINS - rMin));
	const sectorFrom = dipCount(observed.subarray(outward), rMin + outward, zeroRadii, 1).tested > 0 ? outward : 0;
	let isotropic = 0;
	for (const sector of sectorMeans(power, n, rMax, SECTORS)) {
		const profile = trend.residual(signalLog(sector, rs, noisePower)).subarray(sectorFrom);
		isotropic += dipCount(profile, rMin + sectorFrom, zeroRadii, 1, 'both', RING_MARGIN).passed;
	}
	const isotropy = isotropic / SECTORS;
	const pair = locateRingPair(observed, rMin, zeroRadii);
	const ringRatio = pair && pair.outer / pair.inner;
	// The spacing of the located pair against the spacing the Bessel zeros predict from the inner one.
	const ratioAgrees = !pair || Math.abs((pair.outer - pair.inner) / (pair.inner * (BESSEL_ZEROS[pair.k + 1] / BESSEL_ZEROS[pair.k] - 1)) - 1) <= SPACING_TOLERANCE;
	const c = n / 2;
	return {
		radius: best.radius,
		confidence: pinned || !ratioAgrees ? 0 : Math.max(0, best.r) * dips * isotropy,
		dips,
		isotropy,
		ringRatio,
		correlation: best.r,
		zerosInBand: zeroRadii.filter((r) => r >= rMin && r <= rMax).length,
		profile: fitProfile('radius', rMin, observed, model(smoothedDiskPower(best.radius, n, rs, weights), best.floor)),
		marks: [
			...zeroRadii.filter((r) => r <= rMax).map((r): OverlayMark => ({ kind: 'circle', role: 'zero', cx: c, cy: c, r })),
			...bandMarks(n, rMin, rMax)
		]
	};
}
