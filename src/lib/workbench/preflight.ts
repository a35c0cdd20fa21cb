/**
 * Pre-flight warnings shown before a run (issue 5 §9): conditions of the original that limit what
 * deconvolution can recover, each with one line on why. Thresholds are the lab's defaults.
 */

/** Above this share of saturated pixels, ringing around highlights becomes visible (Whyte et al., IJCV 110(2), 2014). */
export const CLIPPED_LIMIT = 0.01;
/** Noise σ (0–1 scale) above which inverse filtering visibly amplifies grain: about 2 % of full range. */
export const NOISE_LIMIT = 0.02;

export interface PreflightInput {
	format: string;
	width: number;
	height: number;
	analysis: { clippedFraction?: number; noiseSigma?: number[] } | null;
}

export interface PreflightWarning {
	code: 'clipped' | 'jpeg' | 'noise' | 'larger-than-preview';
	title: string;
	explanation: string;
}

export function preflightWarnings(item: PreflightInput, previewEdge: number): PreflightWarning[] {
	const warnings: PreflightWarning[] = [];
	const clipped = item.analysis?.clippedFraction ?? 0;
	if (clipped > CLIPPED_LIMIT) {
		warnings.push({
			code: 'clipped',
			title: `Clipped highlights: ${(clipped * 100).toFixed(1)} % of pixels`,
			explanation: 'Saturated pixels lost their true brightness, so the blur model fails there and restoration rings around them.'
		});
	}
	if (item.format === 'jpeg') {
		warnings.push({
			code: 'jpeg',
			title: 'JPEG input',
			explanation: 'Compression blocks and ringing are not part of the blur; deconvolution sharpens them along with the detail.'
		});
	}
	const noise = Math.max(0, ...(item.analysis?.noiseSigma ?? []));
	if (noise > NOISE_LIMIT) {
		warnings.push({
			code: 'noise',
			title: `High noise: σ ≈ ${(noise * 100).toFixed(1)} % of full range`,
			explanation: 'Deconvolution amplifies noise at the frequencies the blur weakened; expect grain, or use stronger regularisation.'
		});
	}
	if (Math.max(item.width, item.height) > previewEdge) {
		warnings.push({
			code: 'larger-than-preview',
			title: `Larger than the preview (${item.width}×${item.height} px)`,
			explanation: `The screen shows a copy at most ${previewEdge} px on the long edge; judge fine detail on the full-resolution result.`
		});
	}
	return warnings;
}
