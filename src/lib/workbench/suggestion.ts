/**
 * The workbench's "suggest kernel" answer, turned into what a person reads and what the run form
 * takes. Pure: no fetches, no Svelte. The response shape mirrors `estimateJson`
 * (`POST /api/items/{id}/estimate`); suggestion.test.ts checks the two stay assignable.
 *
 * A suggestion is never applied by itself: these helpers only prepare the values that the
 * technician's "Use this kernel" puts into the form, where they can still be changed.
 */
import type { BlurVerdict, EstimationMethod } from '../imaging/estimation/estimate-blur';
import type { FitProfile, OverlayMark } from '../imaging/estimation/overlay';
import type { Region } from '../imaging/estimation/region';
import type { KernelSpec } from '../imaging/kernels/spec';
import type { RunForm } from './run-form';

/** The fitted profile as JSON carries it: plain number arrays instead of Float32Array. */
export interface ProfileJson {
	axis: FitProfile['axis'];
	start: number;
	observed: number[];
	model: number[];
}

export interface ProposalJson {
	kernel: KernelSpec;
	confidence: number;
	method: EstimationMethod;
	overlay: { caption: string; marks: OverlayMark[]; profile: ProfileJson | null };
}

export interface NoiseJson {
	immerkaer: number | null;
	mad: number | null;
	nsr: number | null;
	sigma: number | null;
}

/** The answer of `POST /api/items/{id}/estimate`. */
export interface EstimateResponse {
	verdict: BlurVerdict;
	proposals: ProposalJson[];
	noise: NoiseJson;
	notes: string[];
	region: Region;
	spectrum: { width: number; height: number; centre: { x: number; y: number }; tiles: number; png: string | null } | null;
}

/** The run form's input steps (the `step` of its number fields on the item page). */
export const FORM_STEPS = { length: 0.5, angleDeg: 0.5, radius: 0.25, sigma: 0.1 } as const;

/** Round to a multiple of `step`, then drop the binary noise (0.1 × 3 = 0.30000000000000004). */
function snap(value: number, step: number): number {
	return Number((Math.round(value / step) * step).toFixed(4));
}

/** An angle in degrees folded into the form's range (−180°, 180°]; a line at θ and θ ± 360° is the same line. */
function foldAngle(degrees: number): number {
	const folded = ((((degrees + 180) % 360) + 360) % 360) - 180;
	return folded === -180 ? 180 : folded;
}

/**
 * The run-form values a proposal fills, on the form's steps (length and angle 0.5, radius 0.25,
 * sigma 0.1) and never below one step, so a tiny estimate cannot become an invalid zero.
 * Null for a kernel kind the form's number fields cannot hold (the estimator proposes only
 * line, disk and Gaussian kernels).
 */
export function formValuesOf(kernel: KernelSpec): Partial<RunForm> | null {
	const atLeastOneStep = (value: number, step: number) => Math.max(step, snap(value, step));
	switch (kernel.kind) {
		case 'line':
			return {
				kernelKind: 'line',
				length: atLeastOneStep(kernel.length, FORM_STEPS.length),
				angleDeg: foldAngle(snap(kernel.angleDeg, FORM_STEPS.angleDeg))
			};
		case 'disk':
			return { kernelKind: 'disk', radius: atLeastOneStep(kernel.radius, FORM_STEPS.radius) };
		case 'gaussian':
			return { kernelKind: 'gaussian', sigma: atLeastOneStep(kernel.sigma, FORM_STEPS.sigma) };
		default:
			return null;
	}
}

/** The proposal's kernel in words and numbers, e.g. "Straight motion 15.0 px at 20.0°". */
export function describeKernel(kernel: KernelSpec): string {
	switch (kernel.kind) {
		case 'line':
			return `Straight motion ${kernel.length.toFixed(1)} px at ${kernel.angleDeg.toFixed(1)}°`;
		case 'disk':
			return `Defocus disk, radius ${kernel.radius.toFixed(2)} px`;
		case 'gaussian':
			return `Gaussian, σ ${kernel.sigma.toFixed(2)} px`;
		case 'path':
			return `Motion path of ${kernel.points.length} points`;
		case 'image':
			return `Kernel image ${kernel.width}×${kernel.height} px`;
	}
}

/** What "Use this kernel" puts in the form, in words, e.g. "length 15 px, angle 20°". */
export function describeFill(values: Partial<RunForm>): string {
	const parts: string[] = [];
	if (values.length !== undefined) parts.push(`length ${values.length} px`);
	if (values.angleDeg !== undefined) parts.push(`angle ${values.angleDeg}°`);
	if (values.radius !== undefined) parts.push(`radius ${values.radius} px`);
	if (values.sigma !== undefined) parts.push(`sigma ${values.sigma} px`);
	return parts.join(', ');
}

export type ConfidenceLabel = 'high' | 'moderate' | 'low';

/**
 * Lower bounds of the confidence words. Our own choice, not a published scale: the estimator
 * proposes lines and rings from 0.5 (its default threshold) and caps a Gaussian read from the
 * fall-off alone at 0.6 (GAUSSIAN_CONFIDENCE_CAP), so a fall-off reading is at most "moderate"
 * and only a zero pattern that matches closely (correlation ≥ 0.8) is called "high".
 */
export const CONFIDENCE_THRESHOLDS = { high: 0.8, moderate: 0.6 } as const;

export function confidenceLabel(confidence: number): ConfidenceLabel {
	if (confidence >= CONFIDENCE_THRESHOLDS.high) return 'high';
	if (confidence >= CONFIDENCE_THRESHOLDS.moderate) return 'moderate';
	return 'low';
}

export const METHOD_LABELS: Record<EstimationMethod, string> = {
	'spectral-lines': 'Dark lines in the spectrum',
	'spectral-rings': 'Dark rings in the spectrum',
	'spectral-falloff': 'Fall-off of the spectrum (no zeros found)'
};

export const VERDICT_LABELS: Record<BlurVerdict, string> = {
	motion: 'Straight motion blur found',
	defocus: 'Defocus blur found',
	gaussian: 'Soft, Gaussian-like blur (read from the fall-off only)',
	'no-confident-blur': 'No confident blur found'
};

/** Round to `digits` significant figures: an NSR of 0.000684 must not display as 0.001 or 0. */
function significant(value: number, digits: number): number {
	return Number(value.toPrecision(digits));
}

export interface NoiseSummary {
	/** σ in percent of full scale (the estimate runs on linear-light luminance in [0, 1]). */
	sigmaPercent: number;
	/** Which of the two readings σ is: the estimator uses the smaller. */
	estimator: 'Immerkær' | 'wavelet MAD';
	/** The constant Wiener NSR this noise implies, or null when the response carries none. */
	nsr: number | null;
}

/** The noise line of an answer, or null when no σ could be measured (region too small, non-finite). */
export function noiseSummary(noise: NoiseJson): NoiseSummary | null {
	if (noise.sigma === null || !Number.isFinite(noise.sigma)) return null;
	return {
		sigmaPercent: significant(noise.sigma * 100, 3),
		estimator: noise.sigma === noise.mad && noise.sigma !== noise.immerkaer ? 'wavelet MAD' : 'Immerkær',
		nsr: impliedNsr(noise)
	};
}

/** The Wiener NSR implied by the noise estimate, to 3 significant figures; null when absent or not positive. */
export function impliedNsr(noise: NoiseJson): number | null {
	return noise.nsr !== null && Number.isFinite(noise.nsr) && noise.nsr > 0 ? significant(noise.nsr, 3) : null;
}

/**
 * The rectangle to send: the API takes whole pixels, while a region drawn on a scaled preview
 * arrives fractional. The request covers every pixel the selection touches. Null stays null
 * (the whole image).
 */
export function requestRegion(region: Region | null | undefined): Region | null {
	if (!region) return null;
	const x = Math.max(0, Math.floor(region.x));
	const y = Math.max(0, Math.floor(region.y));
	return {
		x,
		y,
		width: Math.max(1, Math.ceil(region.x + region.width) - x),
		height: Math.max(1, Math.ceil(region.y + region.height) - y)
	};
}

export function sameRegion(a: Region | null, b: Region | null): boolean {
	if (a === null || b === null) return a === b;
	return a.x === b.x && a.y === b.y && a.width === b.width && a.height === b.height;
}

/** "the whole image (960×640 px)" or "a 256×256 px region at (100, 40)". */
export function describeRegion(region: Region, image?: { width: number; height: number }): string {
	const whole = image && region.x === 0 && region.y === 0 && region.width === image.width && region.height === image.height;
	return whole ? `the whole image (${region.width}×${region.height} px)` : `a ${region.width}×${region.height} px region at (${region.x}, ${region.y})`;
}

/**
 * SVG polyline points for the fitted profile: observed and model on one shared vertical scale
 * (so the model's scaling against the data is what the eye compares), x across the width.
 */
export function profilePolylines(profile: ProfileJson, width: number, height: number, pad = 2): { observed: string; model: string } {
	const values = [...profile.observed, ...profile.model].filter(Number.isFinite);
	const lo = values.length ? Math.min(...values) : 0;
	const hi = values.length ? Math.max(...values) : 1;
	const span = hi > lo ? hi - lo : 1;
	const count = Math.max(profile.observed.length, profile.model.length);
	const x = (i: number) => (count > 1 ? pad + (i * (width - 2 * pad)) / (count - 1) : width / 2);
	const y = (v: number) => height - pad - ((v - lo) * (height - 2 * pad)) / span;
	const points = (series: number[]) =>
		series
			.map((v, i) => (Number.isFinite(v) ? `${x(i).toFixed(1)},${y(v).toFixed(1)}` : null))
			.filter((p) => p !== null)
			.join(' ');
	return { observed: points(profile.observed), model: points(profile.model) };
}
