import { radialMean } from './radial-profile';

/** Frequency band (in bins from the spectrum's centre) where the blur's signature can be read. */
export interface AnalysisBand {
	/** Inner radius: below it the window's main lobe smears the zero-frequency peak. */
	rMin: number;
	/** Outer radius: beyond it the scene's signal has sunk into the noise floor, or the corners begin. */
	rMax: number;
}

/** Bins next to the centre that the Hann window's main lobe (±2 bins) spreads the mean into. */
const INNER_BINS = 3;

/** Share of the Nyquist radius used at most: beyond it the disc of analysis would reach the corners' aliasing. */
const OUTER_SHARE = 0.9;

/** Options of {@link analysisBand}. */
export interface AnalysisBandOptions {
	/**
	 * The band ends where the ring-averaged power falls below this multiple of the noise power
	 * σ² (the floor of a Welch spectrum normalised as in averagedPowerSpectrum): there the blur's
	 * zeros are filled by noise and no longer visible. @default 2
	 */
	snrFloor?: number;
	/**
	 * 'first': the band ends before the first ring below the floor (lines and fall-offs, whose
	 * signal only decreases outwards). 'last': it ends at the last ring above the floor, so a dark
	 * ring that dips into the noise, with a brighter lobe beyond it, stays inside (defocus).
	 * @default 'first'
	 */
	edge?: 'first' | 'last';
}

/**
 * The usable band of a centred power spectrum: from 3 bins (past the window's main lobe) to the
 * first ring whose mean power P̄(r) < snrFloor·σ² (or, with edge 'last', the last ring above it),
 * at most 0.9·N/2. Common practice, no source:
 * spectral zeros are read only where the signal stands above the noise (Cannon 1976 uses the same
 * argument for averaging sub-image spectra).
 * @throws RangeError for a negative or non-finite noise σ or a non-positive snrFloor.
 */
export function analysisBand(power: Float64Array, n: number, noiseSigma: number, options: AnalysisBandOptions = {}): AnalysisBand {
	const snrFloor = options.snrFloor ?? 2;
	if (!(noiseSigma >= 0) || !Number.isFinite(noiseSigma)) throw new RangeError(`noise σ must be finite and ≥ 0, got ${noiseSigma}`);
	if (!(snrFloor > 0)) throw new RangeError(`snrFloor must be positive, got ${snrFloor}`);
	const outer = Math.floor(OUTER_SHARE * (n / 2));
	const ring = radialMean(power, n, outer);
	const floor = snrFloor * noiseSigma * noiseSigma;
	let rMax = outer;
	if (options.edge === 'last') {
		while (rMax > INNER_BINS && !(ring[rMax] > floor)) rMax--;
	} else {
		for (let r = INNER_BINS; r <= outer; r++) {
			if (!(ring[r] > floor)) {
				rMax = r - 1;
				break;
			}
		}
	}
	return { rMin: INNER_BINS, rMax: Math.max(INNER_BINS, rMax) };
}
