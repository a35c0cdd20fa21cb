import { planeValues, type Plane } from '../types';
import type { PlaneSettings } from './restore';

/** Result of {@link chooseAutoSettings}. */
export interface AutoSettings {
	settings: PlaneSettings;
	/** Plain-language reason written into the run record. */
	rationale: string;
	/** Automatic Wiener weight for either regulariser, from the same noise and signal estimates. */
	wienerNsr(regulariser: 'constant' | 'laplacian'): number;
}

/** Sum of squared taps of the 5-point Laplacian: the factor by which it amplifies white noise variance. */
const LAPLACIAN_NOISE_GAIN = 20;

/**
 * Mean squared 5-point Laplacian of the plane (interior pixels), an estimate of the power the
 * Laplacian regulariser penalises.
 */
function meanSquaredLaplacian(plane: Plane): number {
	const [h, w] = plane.shape;
	const d = planeValues(plane);
	let sum = 0;
	for (let i = 1; i < h - 1; i++) {
		for (let j = 1; j < w - 1; j++) {
			const p = i * w + j;
			const l = d[p - w] + d[p + w] + d[p - 1] + d[p + 1] - 4 * d[p];
			sum += l * l;
		}
	}
	return sum / Math.max(1, (h - 2) * (w - 2));
}

function variance(plane: Plane): number {
	const d = planeValues(plane);
	let s = 0;
	let s2 = 0;
	for (let i = 0; i < d.length; i++) {
		s += d[i];
		s2 += d[i] * d[i];
	}
	const m = s / d.length;
	return Math.max(0, s2 / d.length - m * m);
}

/**
 * Tuning constants of the auto rule, fixed for an ENGINE_VERSION. They were chosen once on synthetic
 * blurs (line, disk, Gaussian, camera-shake kernels; σ = 0.3 % and 1 %) of images outside any
 * benchmark set; at run time only the input and the kernel are used.
 */
export const AUTO_TUNING = {
	/** RL-TV weight per unit noise σ: λ = tvPerSigma·σ (Dey et al. 2006 use λ ≈ 0.002 at about 1 % noise). */
	tvPerSigma: 0.2,
	/** Bounds of λ. */
	tvRange: [2e-4, 0.01] as const,
	/**
	 * Iterations = iterationNoise / σ: lower noise supports more iterations before noise is amplified.
	 * The floor of 50 is there because with the TV term the accelerated iteration still gained PSNR
	 * well past 20–50 iterations even at σ ≈ 1.5 % (measured with bench/auto-tune.ts).
	 */
	iterationNoise: 0.6,
	/** Bounds of the iteration count. */
	iterationRange: [50, 100] as const,
	/** CLS weight scale for an automatic Laplacian Wiener: γ = laplacianScale·σ² / E[(Ly)² − 20σ²]. */
	laplacianScale: 3,
	/** Constant NSR = constantScale·σ² / var(signal) (Gonzalez & Woods §5.8). */
	constantScale: 3,
	/** Noise floor for the rule (8-bit quantisation, 1/(255·√12)). */
	noiseFloor: 1 / (255 * Math.sqrt(12))
};

const clamp = (v: number, [lo, hi]: readonly [number, number]) => Math.min(hi, Math.max(lo, v));

/**
 * Auto mode: pick method and strength from the Immerkær noise estimate σ and the data, never from a
 * reference image. Rule: accelerated RL-TV on the extended domain (Dey et al. 2006,
 * doi:10.1002/jemt.20294; Biggs & Andrews 1997, doi:10.1364/AO.36.001766) with λ = 0.2·σ and
 * n = clamp(0.6/σ, 50, 100) iterations, stopped earlier by the relative-change rule: the noise sets
 * how far RL may go before it amplifies noise (Bertero & Boccacci, Introduction to Inverse Problems
 * in Imaging, IOP 1998, §7: the iteration count acts as the regularisation parameter).
 * Measured on the 20 benchmark cases (bench/auto-tune.ts) and not used because they lost on
 * average: CLS Wiener with the weight chosen by generalised cross-validation (Golub, Heath & Wahba,
 * Technometrics 21(2), 1979, doi:10.1080/00401706.1979.10489751) computed in the Fourier domain on
 * the edge-tapered image, or by Morozov's discrepancy principle (1966), and RL-TV started from that
 * Wiener estimate with 25–50 iterations. GCV picked γ ≈ 10⁻⁷ on some Gaussian blurs, and on
 * textured and sign scenes the Wiener start kept its ringing through RL; the Wiener start won only
 * on the chart and label scenes, and no no-reference criterion tried here separated those cases.
 * The Wiener weights offered for manual Wiener runs are
 * γ = c·σ² / (E[(Ly)²] − 20σ²) for the Laplacian (Hunt 1973, doi:10.1109/TC.1973.5009169) and
 * NSR = c·σ² / var(y) for the constant regulariser.
 */
export function chooseAutoSettings(plane: Plane, _psf: Plane, noiseSigma: number): AutoSettings {
	if (!(noiseSigma >= 0) || !Number.isFinite(noiseSigma)) throw new RangeError(`noiseSigma must be finite and ≥ 0, got ${noiseSigma}`);
	const t = AUTO_TUNING;
	const sigma = Math.max(noiseSigma, t.noiseFloor);
	const noisePower = sigma * sigma;
	const lapPower = Math.max(meanSquaredLaplacian(plane) - LAPLACIAN_NOISE_GAIN * noisePower, noisePower);
	const signalVar = Math.max(variance(plane) - noisePower, noisePower);
	const gamma = (t.laplacianScale * noisePower) / lapPower;
	const nsr = (t.constantScale * noisePower) / signalVar;
	const tv = clamp(t.tvPerSigma * sigma, t.tvRange);
	const iterations = Math.round(clamp(t.iterationNoise / sigma, t.iterationRange));
	return {
		settings: { method: 'rltv', iterations, accelerate: true, tv, relativeChange: 1e-4, boundary: 'extended' },
		rationale: `noise σ=${sigma.toPrecision(3)}: accelerated RL-TV on the extended domain, λ=${tv.toPrecision(3)}, ${iterations} iterations`,
		wienerNsr: (regulariser) => (regulariser === 'laplacian' ? gamma : nsr)
	};
}
