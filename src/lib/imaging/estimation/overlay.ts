/**
 * What a UI draws beside a proposal: the log power spectrum as a small grey image, marks in that
 * image's pixel coordinates (x right, y down, one pixel per frequency bin, zero frequency at
 * `centre`), and the 1-D profile the model was fitted to.
 */
import { leastSquaresScale } from './nuisance';

export interface SpectrumImage {
	width: number;
	height: number;
	/** Row-major log power scaled to [0, 1] between its 0.5th and 99.5th percentiles. */
	data: Float32Array;
	/** Pixel of zero frequency; pixel (x, y) is frequency ((x − cx)/width, (y − cy)/height) cycles/pixel. */
	centre: { x: number; y: number };
	/** Tiles averaged into the spectrum. */
	tiles: number;
}

export type OverlayMark =
	| {
			kind: 'segment';
			/** 'zero': a predicted dark line of the proposed kernel; 'direction': the blur direction through the centre. */
			role: 'zero' | 'direction';
			x1: number;
			y1: number;
			x2: number;
			y2: number;
	  }
	| {
			kind: 'circle';
			/** 'zero': a predicted dark ring; 'half-transfer': where |H| = ½; 'band': limits of the analysed band. */
			role: 'zero' | 'half-transfer' | 'band';
			cx: number;
			cy: number;
			r: number;
	  };

/**
 * The evidence curve: the observed log-spectrum profile and the proposed kernel's model, both with
 * the fitted nuisance trend removed and the model scaled to the data by least squares.
 */
export interface FitProfile {
	/** 'across-lines': distance from the centre along the blur direction; 'radius': ring radius. Both in bins. */
	axis: 'across-lines' | 'radius';
	/** Bin of the first sample; sample i is at bin start + i. */
	start: number;
	observed: Float32Array;
	model: Float32Array;
}

export interface Overlay {
	/** The shared spectrum image (the same object for every proposal of one estimate). */
	spectrum: SpectrumImage;
	marks: OverlayMark[];
	profile: FitProfile | null;
	/** One line saying what the marks show. */
	caption: string;
}

/** Display range of the spectrum image: percentiles, so a few extreme bins do not flatten the rest. */
const LOW_PERCENTILE = 0.005;
const HIGH_PERCENTILE = 0.995;

/**
 * Scale a centred N×N log power map to a [0, 1] Float32 image for display.
 * @throws RangeError when the map is not N×N.
 */
export function spectrumImage(logPower: Float64Array, n: number, tiles: number): SpectrumImage {
	if (logPower.length !== n * n) throw new RangeError(`map holds ${logPower.length} values, expected ${n}×${n}`);
	const sorted = Float64Array.from(logPower).sort();
	const lo = sorted[Math.floor(LOW_PERCENTILE * (sorted.length - 1))];
	const hi = sorted[Math.ceil(HIGH_PERCENTILE * (sorted.length - 1))];
	const span = hi > lo ? hi - lo : 1;
	const data = Float32Array.from(logPower, (v) => Math.min(1, Math.max(0, (v - lo) / span)));
	return { width: n, height: n, data, centre: { x: n / 2, y: n / 2 }, tiles };
}

/** Circles at the limits of the analysed band. */
export function bandMarks(n: number, rMin: number, rMax: number): OverlayMark[] {
	return [rMin, rMax].map((r) => ({ kind: 'circle', role: 'band', cx: n / 2, cy: n / 2, r }));
}

/** Observed profile and least-squares-scaled model as Float32 curves for display. */
export function fitProfile(axis: FitProfile['axis'], start: number, observed: Float64Array, model: Float64Array): FitProfile {
	const scale = leastSquaresScale(observed, model);
	return { axis, start, observed: Float32Array.from(observed), model: Float32Array.from(model, (v) => v * scale) };
}
