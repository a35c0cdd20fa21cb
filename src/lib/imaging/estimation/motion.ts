import type { AnalysisBand } from './band';
import { dipShare } from './dips';
import { leastSquaresScale, NuisanceProjector, residualCorrelation } from './nuisance';
import { bandMarks, fitProfile, type FitProfile, type OverlayMark } from './overlay';
import { radialMean } from './radial-profile';

/** A straight-motion reading of a spectrum (see {@link estimateStraightMotion}). */
export interface MotionEstimate {
	/** Blur length L in pixels. */
	length: number;
	/** Blur direction in degrees counter-clockwise from +x on screen, in [0, 180) (a line has no sign). */
	angleDeg: number;
	/**
	 * Evidence in [0, 1]: max(0, correlation) · max(0, dipsAlong − dipsAcross) · depthAgreement. It
	 * is high only when the dark lines sit where the kernel predicts, are real dips, are absent
	 * across the blur direction (an isotropic ring pattern shows the same dips both ways), and are
	 * as deep as a line kernel's zeros make them.
	 */
	confidence: number;
	/** Share of the first dark lines that are real dips along the blur direction (see dipShare). */
	dipsAlong: number;
	/** The same test at the same spacing across the blur direction, where a line blur has no dips. */
	dipsAcross: number;
	/** Correlation of the observed profile with the model's, trend removed, in [−1, 1]. */
	correlation: number;
	/**
	 * Fitted scale a = ⟨p, m⟩ / |m|² of the trend-free model m = ln(sinc² + δ) on the observed
	 * profile p, at the fill depth δ that agrees best: 1 when the dips are as deep as the kernel's
	 * zeros predict, well under ½ when a shallow ripple of the scene merely has their spacing.
	 */
	depthScale: number;
	/**
	 * Share of the scaled fit's explained sum of squares that the model keeps at its own depth,
	 * (2a − 1) / a², floored at 0 (see estimateStraightMotion, step 5): 1 at a = 1, 0 for a ≤ ½.
	 */
	depthAgreement: number;
	/** Dark lines of the proposed kernel that fall inside the analysed band. */
	zerosInBand: number;
	/** Quefrency of the cepstrum's negative peak along the blur direction, pixels; null when it has none. */
	cepstralLength: number | null;
	profile: FitProfile;
	marks: OverlayMark[];
}

/** Options of {@link estimateStraightMotion}. */
export interface MotionOptions {
	/** Shortest length searched, pixels. @default 3 */
	minLength?: number;
	/** Longest length searched, pixels; at most N/4, so that dark lines stay at least 4 bins apart. @default N/4 */
	maxLength?: number;
	/** Step of the coarse angle scan, degrees (the refinement searches ±2 steps around the best). @default 1 */
	angleStepDeg?: number;
}

/**
 * Depth floors δ tried for the model ln(sinc² + δ): the window's leakage and the noise fill the
 * zeros to an unknown depth, so the model's dips are given a few depths and the best fit is kept.
 */
const MODEL_FLOORS = [0.01, 0.03, 0.1];
/**
 * Fill depths tried by the depth check (step 5): those of the search, and two deeper ones, since an
 * image with little noise fills a line's zeros with the window's leakage alone. Tuning constant, no source.
 */
const DEPTH_FLOORS = [0.001, 0.003, ...MODEL_FLOORS];
const FINE_LENGTH_STEP = 0.02;
const FINE_ANGLE_STEP = 0.05;
/** The outer tenth of the analysed disc is left out of the profile: its chords are too short to average. */
const CHORD_SHARE = 0.9;
/** Strongest coarse directions refined and judged in full, at least SEPARATION_DEG apart. */
const CANDIDATES = 5;
const SEPARATION_DEG = 3;
/** Share of the top confidence a candidate needs to stay in the final choice (tuning constant, no source). */
const CONFIDENCE_SLACK = 0.8;
/** Dark lines a length must place inside the band to be considered (see the search). */
const MIN_ZEROS = 2;

/** Difference of two line directions, in [0, 90] degrees. */
function angleGap(a: number, b: number): number {
	const d = Math.abs(a - b) % 180;
	return Math.min(d, 180 - d);
}

function unit(v: Float64Array): Float64Array {
	let ss = 0;
	for (let i = 0; i < v.length; i++) ss += v[i] * v[i];
	return ss > 0 ? v.map((x) => x / Math.sqrt(ss)) : v;
}

const sinc = (x: number) => (x === 0 ? 1 : Math.sin(Math.PI * x) / (Math.PI * x));

/** Log power profile of a line of `length` px across its dark lines: ln(sinc²(L·t/N) + δ). */
function lineModel(length: number, n: number, ts: Float64Array, floor: number): Float64Array {
	return ts.map((t) => Math.log(sinc((length * t) / n) ** 2 + floor));
}

/** Annulus rMin ≤ r ≤ rMax of the log spectrum with its ring mean removed: the anisotropic part. */
function anisotropicPart(logPower: Float64Array, n: number, band: AnalysisBand) {
	const ring = radialMean(logPower, n, band.rMax);
	const u: number[] = [];
	const v: number[] = [];
	const value: number[] = [];
	const c = n / 2;
	for (let y = 0; y < n; y++) {
		for (let x = 0; x < n; x++) {
			const r = Math.hypot(x - c, y - c);
			if (r < band.rMin || r > band.rMax) continue;
			const r0 = Math.min(Math.floor(r), band.rMax - 1);
			const f = r - r0;
			u.push(x - c);
			v.push(y - c);
			value.push(logPower[y * n + x] - ((1 - f) * ring[r0] + f * ring[r0 + 1]));
		}
	}
	return { u: Float64Array.from(u), v: Float64Array.from(v), value: Float64Array.from(value) };
}

/**
 * Estimate straight motion blur from a centred log power spectrum (Welch-averaged, windowed).
 * A line of length L along unit direction d has |H(ω)| = |sinc(L·ω·d)| (Gonzalez & Woods, Digital
 * Image Processing, 4th ed., 2018, §5.6: |H(k)| = |sin(πkL/N) / (L·sin(πk/N))| on an N-point DFT), so
 * the spectrum is crossed by parallel dark lines perpendicular to d, N/L bins apart.
 * 1. The ring mean of the log spectrum is removed (the scene's isotropic fall-off and any isotropic
 *    blur), leaving the anisotropic part.
 * 2. Radon step (as Moghaddam & Jamzad 2007 use for the direction): for every direction φ (coarse steps), the anisotropic part is projected onto d(φ)
 *    (mean along lines perpendicular to d), folded to t = |ω·d| bins, its quadratic trend removed,
 *    and correlated with the trend-free model ln(sinc²(L·t/N) + δ) for L on a grid. The direction and
 *    length of the best correlation per direction are kept, and the five strongest directions (at
 *    least 3° apart) are refined on a fine grid by the fitted dip depth.
 * 3. Cepstral check: the negative peak of the profile's cosine transform, C(q) = Σ_t p(t)·cos(2πqt/N),
 *    lies at quefrency q = L, because ln|sin(πLt/N)|² is N/L-periodic in t (Cannon 1976). Its length is refined as a second candidate and kept if it fits better.
 * Directions: spectrum pixel (x, y) maps to frequency (x − N/2, y − N/2)/N with y down, the same axes
 * as the image, so d(φ) = (cos φ, sin φ) measured clockwise on screen and the kernel angle is −φ mod 180°.
 * 4. Dip test: the first dark lines must be real minima of the projected anisotropic part along d and
 *    not across it (dipShare).
 * 5. Depth check against the no-line model. A line's |H| = |sin(πkL/N) / (L·sin(πk/N))| has true zeros
 *    (Gonzalez & Woods §5.6), so its dark lines are as deep in log power as ln(sinc² + δ) says, with δ
 *    the depth to which noise and window leakage fill them; the model has no free scale. The rival
 *    reading, an isotropic blur such as a Gaussian, whose transfer function has no zeros (Gonzalez &
 *    Woods §4.8), leaves nothing in the anisotropic part but the scene's own anisotropy, so its model
 *    of the profile is zero. Subtracting the line model at its own depth removes the share
 *    1 − |p − m|²/|p|² = (2a − 1)·|m|²/|p|² of the profile's sum of squares (a = ⟨p, m⟩/|m|², the
 *    fitted scale), against r² = a²·|m|²/|p|² for the best scaled fit; their ratio, (2a − 1)/a², is
 *    1 at a = 1 and ≤ 0 once a ≤ ½, where the line model fits worse than no line at all: the dips are
 *    a shallow ripple of the scene (rows of letters, the bright axes of straight edges) with the right
 *    spacing, not the zeros of a blur (Cannon 1976 identifies a blur by the zeros of its transfer function).
 *    Comparing the residual sums of squares of the two nested models is the extra-sum-of-squares
 *    principle (N. R. Draper & H. Smith, Applied Regression Analysis, 3rd ed., 1998, §6.1, from
 *    memory). The best ratio over a few fill depths δ is the depth agreement.
 * The confidence is the correlation times the difference of the two dip shares times the depth
 * agreement, and among the candidates within 80 % of the highest confidence the one with the largest
 * atanh(r)·√(lines in band) is returned (R. A. Fisher, Biometrika 10(4):507–521, 1915, from memory,
 * for the z-transform of a correlation; the weighting by line count is this module's choice).
 * Only lengths that put at least two dark lines inside the band are searched: one broad dip is
 * imitated too easily by the scene's own anisotropy.
 * @see M. Cannon, "Blind deconvolution of spatially invariant image blurs with phase", IEEE Trans.
 *   ASSP 24(1):58–63, 1976, doi:10.1109/TASSP.1976.1162770; M. E. Moghaddam, M. Jamzad, "Linear
 *   motion blur parameter estimation in noisy images using fuzzy sets and power spectrum", EURASIP
 *   J. Advances in Signal Processing 2007, 068985, doi:10.1155/2007/68985 (Radon transform of the
 *   spectrum for the direction).
 * @returns null when the band is narrower than 8 bins or too narrow to hold two dark lines of any
 *   admissible length.
 * @throws RangeError for a map that is not N×N or invalid options.
 */
export function estimateStraightMotion(logPower: Float64Array, n: number, band: AnalysisBand, options: MotionOptions = {}): MotionEstimate | null {
	if (logPower.length !== n * n) throw new RangeError(`map holds ${logPower.length} values, expected ${n}×${n}`);
	const minLength = options.minLength ?? 3;
	const maxLength = Math.min(options.maxLength ?? n / 4, n / 4);
	const angleStep = options.angleStepDeg ?? 1;
	if (!(minLength >= 1) || !(maxLength > minLength)) throw new RangeError(`need 1 ≤ minLength < maxLength ≤ N/4, got ${minLength}, ${maxLength}`);
	if (!(angleStep > 0 && angleStep <= 5)) throw new RangeError(`angleStepDeg must lie in (0, 5], got ${angleStep}`);
	const tLo = band.rMin;
	const tHi = Math.floor(CHORD_SHARE * band.rMax);
	// A length whose second dark line lies outside the band leaves one broad dip, which any smooth
	// anisotropy of the scene can imitate: such lengths are not searched.
	const shortest = Math.max(minLength, (MIN_ZEROS * n) / tHi);
	if (tHi - tLo < 8 || shortest > maxLength) return null;

	const part = anisotropicPart(logPower, n, band);
	const ts = Float64Array.from({ length: tHi - tLo + 1 }, (_, i) => tLo + i);
	const trend = new NuisanceProjector([ts.map(() => 1), ts, ts.map((t) => t * t)]);

	/** Radon projection of `values` across lines perpendicular to d(φ), folded to t = |ω·d| bins. */
	const project = (values: Float64Array, phiDeg: number): Float64Array => {
		const phi = (phiDeg * Math.PI) / 180;
		const cs = Math.cos(phi);
		const sn = Math.sin(phi);
		const sum = new Float64Array(tHi + 2);
		const weight = new Float64Array(tHi + 2);
		for (let i = 0; i < values.length; i++) {
			const t = Math.abs(part.u[i] * cs + part.v[i] * sn);
			if (t >= tHi + 1) continue;
			const t0 = Math.floor(t);
			const f = t - t0;
			sum[t0] += (1 - f) * values[i];
			weight[t0] += 1 - f;
			sum[t0 + 1] += f * values[i];
			weight[t0 + 1] += f;
		}
		return ts.map((t) => (weight[t] > 0 ? sum[t] / weight[t] : 0));
	};
	const profileCache = new Map<number, Float64Array>();
	/** Trend-free projection of the anisotropic part. */
	const profile = (phiDeg: number): Float64Array => {
		let p = profileCache.get(phiDeg);
		if (!p) profileCache.set(phiDeg, (p = trend.residual(project(part.value, phiDeg))));
		return p;
	};
	const fit = (phiDeg: number, length: number, floor: number) => residualCorrelation(profile(phiDeg), trend.residual(lineModel(length, n, ts, floor)));

	// Unit-norm residual models, so a coarse correlation is one dot product.
	const bank: { length: number; floor: number; model: Float64Array }[] = [];
	// Geometric steps that move the outermost dark line by at most 0.4 bin: narrow dips far out are not stepped over.
	for (let length = shortest; length <= maxLength + 1e-9; length *= 1 + 0.4 / tHi) {
		for (const floor of MODEL_FLOORS) bank.push({ length, floor, model: unit(trend.residual(lineModel(length, n, ts, floor))) });
	}
	// Best model per coarse direction; the few strongest directions are refined and judged in full.
	const perAngle: { r: number; phi: number; length: number; floor: number }[] = [];
	for (let phi = 0; phi < 180; phi += angleStep) {
		const p = unit(profile(phi));
		let top = { r: -Infinity, phi, length: shortest, floor: MODEL_FLOORS[0] };
		for (const m of bank) {
			let r = 0;
			for (let i = 0; i < p.length; i++) r += p[i] * m.model[i];
			if (r > top.r) top = { r, phi, length: m.length, floor: m.floor };
		}
		perAngle.push(top);
	}
	const starts: typeof perAngle = [];
	for (const candidate of [...perAngle].sort((a, b) => b.r - a.r)) {
		if (starts.length === CANDIDATES) break;
		if (starts.every((s) => angleGap(s.phi, candidate.phi) > SEPARATION_DEG)) starts.push(candidate);
	}

	// Refinement maximises the fitted dip depth ⟨p, m̂⟩ = r·|p| rather than r alone: near the true
	// direction r is flat (the shape stays right while the lines smear), whereas the projected dips
	// are deepest when the projection runs exactly along the dark lines.
	const depth = (phiDeg: number, length: number, floor: number) => {
		const m = trend.residual(lineModel(length, n, ts, floor));
		const p = profile(phiDeg);
		let pm = 0;
		let mm = 0;
		for (let i = 0; i < m.length; i++) {
			pm += p[i] * m[i];
			mm += m[i] * m[i];
		}
		return mm > 0 ? pm / Math.sqrt(mm) : 0;
	};
	const refineLength = (phi: number, around: number, floor: number) => {
		let out = { depth: -Infinity, length: around };
		const reach = Math.max(2 * FINE_LENGTH_STEP, (around * 0.8) / tHi);
		for (let length = Math.max(shortest, around - reach); length <= Math.min(maxLength, around + reach) + 1e-9; length += FINE_LENGTH_STEP) {
			const d = depth(phi, length, floor);
			if (d > out.depth) out = { depth: d, length };
		}
		return out;
	};
	const refineAngle = (around: number, length: number, floor: number) => {
		let out = { depth: -Infinity, phi: around };
		for (let phi = around - 2 * angleStep; phi <= around + 2 * angleStep + 1e-9; phi += FINE_ANGLE_STEP) {
			const snapped = Math.round(phi / FINE_ANGLE_STEP) * FINE_ANGLE_STEP;
			const d = depth(snapped, length, floor);
			if (d > out.depth) out = { depth: d, phi: snapped };
		}
		return out;
	};
	/** Refine one start (length, direction, length again, cepstral alternative) and judge it in full. */
	const judge = (start: (typeof perAngle)[number]) => {
		const { floor } = start;
		let length = refineLength(start.phi, start.length, floor).length;
		let phi = refineAngle(start.phi, length, floor).phi;
		let fitted = refineLength(phi, length, floor);
		length = fitted.length;
		const cepstralLength = cepstralPeak(profile(phi), ts, n, shortest, maxLength);
		if (cepstralLength !== null) {
			const alternative = refineLength(phi, cepstralLength, floor);
			if (alternative.depth > fitted.depth) {
				fitted = alternative;
				length = alternative.length;
				phi = refineAngle(phi, length, floor).phi;
			}
		}
		const spacing = n / length;
		const zerosInBand = Math.max(0, Math.floor(tHi / spacing) - Math.ceil(tLo / spacing) + 1);
		const correlation = fit(phi, length, floor);
		const zeros = Array.from({ length: zerosInBand + 2 }, (_, k) => (k + 1) * spacing);
		const dipsAlong = dipShare(project(part.value, phi), tLo, zeros);
		const dipsAcross = dipShare(project(part.value, phi + 90), tLo, zeros);
		const depthFit = DEPTH_FLOORS.map((d) => depthCheck(profile(phi), trend.residual(lineModel(length, n, ts, d)))).reduce((a, b) => (b.agreement > a.agreement ? b : a));
		const confidence = Math.max(0, correlation) * Math.max(0, dipsAlong - dipsAcross) * depthFit.agreement;
		return { phi, length, floor, spacing, zerosInBand, correlation, dipsAlong, dipsAcross, depthFit, confidence, cepstralLength };
	};
	const judged = starts.map(judge);
	// The dip test removes candidates whose dark lines are not real (confidence below CONFIDENCE_SLACK
	// of the best); the rest are ranked by Fisher's z of the correlation, atanh(r), times √(dark
	// lines in band): a fit resting on more lines is the more specific one, so a short length that
	// fits a few broad dips by coincidence loses to the length whose many lines all match.
	const topConfidence = Math.max(...judged.map((j) => j.confidence));
	const specificity = (j: (typeof judged)[number]) => Math.atanh(Math.min(0.999, Math.max(0, j.correlation))) * Math.sqrt(j.zerosInBand);
	const best = judged
		.filter((j) => j.confidence >= CONFIDENCE_SLACK * topConfidence)
		.reduce((a, b) => (specificity(b) > specificity(a) ? b : a));
	const { phi, length, spacing, zerosInBand, correlation, dipsAlong, dipsAcross, depthFit, confidence, cepstralLength } = best;
	const model = trend.residual(lineModel(length, n, ts, best.floor));
	return {
		length,
		angleDeg: (((-phi % 180) + 180) % 180) % 180,
		confidence,
		dipsAlong,
		dipsAcross,
		correlation,
		depthScale: depthFit.scale,
		depthAgreement: depthFit.agreement,
		zerosInBand,
		cepstralLength,
		profile: fitProfile('across-lines', tLo, profile(phi), model),
		marks: [...lineMarks(n, phi, spacing, band.rMax), ...bandMarks(n, band.rMin, band.rMax)]
	};
}

/**
 * Step 5 of estimateStraightMotion for one fill depth: the fitted scale a = ⟨p, m⟩/|m|² of the
 * trend-free model m on the trend-free profile p, and max(0, (2a − 1)/a²), the share of the scaled
 * fit's explained sum of squares that the model keeps at its own depth (a = 1).
 */
function depthCheck(p: Float64Array, m: Float64Array): { scale: number; agreement: number } {
	const scale = leastSquaresScale(p, m);
	return { scale, agreement: scale > 0.5 ? (2 * scale - 1) / (scale * scale) : 0 };
}

/**
 * Quefrency in [minQ, maxQ] (steps of 0.05 px) where C(q) = Σ p(t)·cos(2πqt/N) is most negative;
 * null when C stays non-negative (no periodic dips).
 */
function cepstralPeak(p: Float64Array, ts: Float64Array, n: number, minQ: number, maxQ: number): number | null {
	let bestQ: number | null = null;
	let bestC = 0;
	for (let q = minQ; q <= maxQ + 1e-9; q += 0.05) {
		let c = 0;
		for (let i = 0; i < p.length; i++) c += p[i] * Math.cos((2 * Math.PI * q * ts[i]) / n);
		if (c < bestC) {
			bestC = c;
			bestQ = q;
		}
	}
	return bestQ;
}

/** The blur direction through the centre and the predicted dark lines (ω·d = k/L) inside the band's disc. */
function lineMarks(n: number, phiDeg: number, spacing: number, rMax: number): OverlayMark[] {
	const phi = (phiDeg * Math.PI) / 180;
	const dx = Math.cos(phi);
	const dy = Math.sin(phi);
	const c = n / 2;
	const marks: OverlayMark[] = [{ kind: 'segment', role: 'direction', x1: c - rMax * dx, y1: c - rMax * dy, x2: c + rMax * dx, y2: c + rMax * dy }];
	for (let k = 1; k * spacing < rMax; k++) {
		for (const s of [k * spacing, -k * spacing]) {
			const h = Math.sqrt(rMax * rMax - s * s);
			marks.push({ kind: 'segment', role: 'zero', x1: c + s * dx + h * dy, y1: c + s * dy - h * dx, x2: c + s * dx - h * dy, y2: c + s * dy + h * dx });
		}
	}
	return marks;
}
