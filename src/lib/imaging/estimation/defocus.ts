import type { AnalysisBand } from './band';
import { besselJ1Zeros, jinc } from './bessel';
import { dipShare } from './dips';
import { NuisanceProjector, residualCorrelation } from './nuisance';
import { bandMarks, fitProfile, type FitProfile, type OverlayMark } from './overlay';
import { radialMean } from './radial-profile';

/** A defocus reading of a spectrum (see {@link estimateDefocus}). */
export interface DefocusEstimate {
	/** Disk radius R in pixels. */
	radius: number;
	/** Evidence in [0, 1]: max(0, correlation) · dips (a ring fit without real dark rings scores 0). */
	confidence: number;
	/** Share of the first dark rings that are real dips of the trend-free ring profile (see dipShare). */
	dips: number;
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
}

/** Depth floors δ of the model ln(jinc² + δ) (see motion.ts for why several are tried). */
const MODEL_FLOORS = [0.01, 0.03, 0.1];
const FINE_STEP = 0.005;
const [FIRST_ZERO, SECOND_ZERO] = besselJ1Zeros(2);

/** Log power of a disk of radius R over ring radii r (bins): ln(jinc²(2πR·r/N) + δ). */
function diskModel(radius: number, n: number, rs: Float64Array, floor: number): Float64Array {
	return rs.map((r) => Math.log(jinc((2 * Math.PI * radius * r) / n) ** 2 + floor));
}

/**
 * Estimate a uniform defocus disk from a centred log power spectrum. The disk's transfer function
 * 2·J1(2πRρ)/(2πRρ) vanishes on rings at ρ = z_k/(2πR), z_1 = 3.8317, so the first dark ring at
 * k0 bins of an N-point spectrum gives R = 0.6098·N/k0. The ring-averaged log spectrum over the
 * band, with a trend a + b·ln r + c·r removed (the scene's power-law fall-off), is correlated with
 * the trend-free model ln((2J1(x)/x)² + δ), x = 2πR·r/N, over a grid of R, then refined.
 * The confidence is the correlation times the share of the first rings that are real dips of the
 * trend-free ring profile (dipShare), so a smooth fall-off fitted by a shallow model scores nothing.
 * Only radii whose band reaches past the first ring to the top of the second lobe (midway between
 * the first two zeros) are searched: a ring whose far side is not seen is just a fall-off.
 * @see M. Cannon, "Blind deconvolution of spatially invariant image blurs with phase", IEEE Trans.
 *   ASSP 24(1):58–63, 1976, doi:10.1109/TASSP.1976.1162770.
 * @returns null when the band is narrower than 8 bins or cannot show a ring of any admissible radius.
 * @throws RangeError for a map that is not N×N or invalid options.
 */
export function estimateDefocus(logPower: Float64Array, n: number, band: AnalysisBand, options: DefocusOptions = {}): DefocusEstimate | null {
	if (logPower.length !== n * n) throw new RangeError(`map holds ${logPower.length} values, expected ${n}×${n}`);
	const minRadius = options.minRadius ?? 1;
	const maxRadius = Math.min(options.maxRadius ?? n / 8, n / 8);
	if (!(minRadius > 0) || !(maxRadius > minRadius)) throw new RangeError(`need 0 < minRadius < maxRadius ≤ N/8, got ${minRadius}, ${maxRadius}`);
	const { rMin, rMax } = band;
	if (rMax - rMin < 8) return null;
	const smallest = Math.max(minRadius, (((FIRST_ZERO + SECOND_ZERO) / 2) * n) / (2 * Math.PI * rMax));
	if (smallest > maxRadius) return null;

	const ring = radialMean(logPower, n, rMax);
	const rs = Float64Array.from({ length: rMax - rMin + 1 }, (_, i) => rMin + i);
	const trend = new NuisanceProjector([rs.map(() => 1), rs.map(Math.log), rs]);
	const observed = trend.residual(rs.map((r) => ring[r]));
	const fit = (radius: number, floor: number) => residualCorrelation(observed, trend.residual(diskModel(radius, n, rs, floor)));

	let best = { r: -Infinity, radius: smallest, floor: MODEL_FLOORS[0] };
	// Geometric steps that move the outermost ring by at most 0.4 bin (see motion.ts).
	for (let radius = smallest; radius <= maxRadius + 1e-9; radius *= 1 + 0.4 / rMax) {
		for (const floor of MODEL_FLOORS) {
			const r = fit(radius, floor);
			if (r > best.r) best = { r, radius, floor };
		}
	}
	const reach = (best.radius * 0.8) / rMax;
	for (let radius = Math.max(smallest, best.radius - reach); radius <= Math.min(maxRadius, best.radius + reach) + 1e-9; radius += FINE_STEP) {
		const r = fit(radius, best.floor);
		if (r > best.r) best = { ...best, r, radius };
	}

	const zeroRadii = besselJ1Zeros(20).map((z) => (z * n) / (2 * Math.PI * best.radius));
	const dips = dipShare(observed, rMin, zeroRadii);
	const c = n / 2;
	return {
		radius: best.radius,
		confidence: Math.max(0, best.r) * dips,
		dips,
		correlation: best.r,
		zerosInBand: zeroRadii.filter((r) => r >= rMin && r <= rMax).length,
		profile: fitProfile('radius', rMin, observed, trend.residual(diskModel(best.radius, n, rs, best.floor))),
		marks: [
			...zeroRadii.filter((r) => r <= rMax).map((r): OverlayMark => ({ kind: 'circle', role: 'zero', cx: c, cy: c, r })),
			...bandMarks(n, rMin, rMax)
		]
	};
}
