import { clippedFraction } from '../analysis/clipping';
import { estimateNoiseSigma } from '../analysis/noise';
import { recoverability, type Recoverability } from '../analysis/recoverability';
import { linearToSrgbArray } from '../colour';
import type { FftBackend } from '../fft/backend';
import type { BlockParallelism } from '../fft/parallel';
import { defaultFftBackend } from '../fft/default-backend';
import { buildKernel } from '../kernels/build';
import { kernelSpecSchema, type KernelSpec } from '../kernels/spec';
import { createPlane, isContiguous, planeValues, type Plane, type RasterImage } from '../types';
import { ENGINE_VERSION } from '../version';
import { chooseAutoSettings, type AutoSettings } from './auto';
import { imageToLinear } from './linear-light';
import { richardsonLucy } from './richardson-lucy';
import { Workspace } from './workspace';
import { wienerDeconvolve, wienerPadding } from './wiener';

/** What to run; every field is written to the run record as resolved. */
export interface RestoreOptions {
	method: 'wiener' | 'rl' | 'rltv' | 'auto';
	/** Wiener noise-to-signal ratio (or Laplacian weight); 'auto' derives it from the noise estimate. @default 'auto' */
	nsr?: number | 'auto';
	/** Wiener regulariser. @default 'constant' for 'wiener' */
	regulariser?: 'constant' | 'laplacian';
	/** Richardson–Lucy iterations. @default 30 */
	iterations?: number;
	/** Biggs–Andrews acceleration. @default true */
	accelerate?: boolean;
	/** RL-TV weight λ. @default 0.002 for 'rltv' */
	tv?: number;
	/** RL stopping rule. @default { relativeChange: 1e-4 } */
	stopping?: { relativeChange?: number };
	/** @default 'taper' for Wiener, 'extended' for Richardson–Lucy */
	boundary?: 'taper' | 'extended' | 'circular';
	/** Deconvolve in linear light (sRGB decoded first, re-encoded after). @default true */
	linearLight?: boolean;
}

export interface RestoreHooks {
	/** Called after each unit of work: one RL iteration or one Wiener channel. */
	onProgress?: (done: number, total: number) => void;
	signal?: AbortSignal;
	fft?: FftBackend;
	/** Buffers and kernel transfer functions shared by the channels of one image (restore() makes one per call). */
	workspace?: Workspace;
	/**
	 * {@link restorePlane} may write a Wiener result into the input plane's own buffer (the caller
	 * owns it and no longer needs it), saving one plane-sized allocation per channel. @default false
	 */
	overwriteInput?: boolean;
}

/** The replayable record of one restoration. */
export interface RunRecord {
	engineVersion: string;
	method: string;
	resolvedMethod: 'wiener' | 'rl' | 'rltv';
	parameters: Record<string, unknown>;
	kernel: KernelSpec;
	kernelSize: [number, number];
	colour: { linearLight: boolean; channels: number };
	boundary: string;
	padding: { mode: string; rows?: number; cols?: number; top?: number; left?: number; margin?: [number, number]; fft: string };
	input: { width: number; height: number; clippedFraction: number; noiseSigma: number };
	recoverability: Recoverability;
	iterationsRun?: number;
}

/** Fully resolved per-plane settings (what {@link restorePlane} runs). */
export type PlaneSettings =
	| { method: 'wiener'; nsr: number; regulariser: 'constant' | 'laplacian'; boundary: 'taper' | 'extended' | 'circular' }
	| {
			method: 'rl' | 'rltv';
			iterations: number;
			accelerate: boolean;
			tv: number;
			relativeChange: number;
			boundary: 'taper' | 'extended' | 'circular';
			/** Start RL from a Wiener estimate with these settings (used by 'auto'). */
			wienerStart?: { nsr: number; regulariser: 'constant' | 'laplacian' };
	  };

/**
 * Restore one plane with resolved settings: Wiener, or Richardson–Lucy / RL-TV optionally started
 * from a Wiener estimate. Pure: arrays in, a new array out. Values are not clipped here.
 */
export function restorePlane(
	plane: Plane,
	psf: Plane,
	settings: PlaneSettings,
	hooks: RestoreHooks = {}
): { plane: Plane; iterationsRun?: number } {
	const fft = hooks.fft ?? defaultFftBackend();
	if (settings.method === 'wiener') {
		hooks.signal?.throwIfAborted();
		const output = hooks.overwriteInput && isContiguous(plane) ? plane : undefined;
		const out = wienerDeconvolve(plane, psf, { nsr: settings.nsr, regulariser: settings.regulariser, boundary: settings.boundary, fft, workspace: hooks.workspace, output });
		hooks.onProgress?.(1, 1);
		return { plane: out };
	}
	const initial = settings.wienerStart
		? wienerDeconvolve(plane, psf, { ...settings.wienerStart, boundary: settings.boundary === 'circular' ? 'circular' : 'taper', fft, workspace: hooks.workspace })
		: undefined;
	const result = richardsonLucy(plane, psf, {
		iterations: settings.iterations,
		accelerate: settings.accelerate,
		tv: settings.tv,
		relativeChange: settings.relativeChange,
		boundary: settings.boundary,
		initial,
		fft,
		onProgress: hooks.onProgress,
		signal: hooks.signal
	});
	return { plane: result.plane, iterationsRun: result.iterationsRun };
}

/** `luminance` is only computed when the settings depend on the image (auto method or NSR). */
function resolveSettings(options: RestoreOptions, noiseSigma: number, psf: Plane, luminance: () => Plane): { settings: PlaneSettings; auto?: AutoSettings } {
	const method = options.method;
	if (method === 'auto') {
		const auto = chooseAutoSettings(luminance(), psf, noiseSigma);
		return { settings: auto.settings, auto };
	}
	if (method === 'wiener') {
		const regulariser = options.regulariser ?? 'constant';
		const nsr = options.nsr === undefined || options.nsr === 'auto' ? chooseAutoSettings(luminance(), psf, noiseSigma).wienerNsr(regulariser) : options.nsr;
		return { settings: { method, nsr, regulariser, boundary: options.boundary ?? 'taper' } };
	}
	if (method === 'rl' || method === 'rltv') {
		return {
			settings: {
				method,
				iterations: options.iterations ?? 30,
				accelerate: options.accelerate ?? true,
				tv: method === 'rltv' ? (options.tv ?? 0.002) : 0,
				relativeChange: options.stopping?.relativeChange ?? 1e-4,
				boundary: options.boundary ?? 'extended'
			}
		};
	}
	throw new RangeError(`unknown method ${String(method)}`);
}

function validateOptions(options: RestoreOptions): void {
	if (typeof options.nsr === 'number' && (!(options.nsr >= 0) || !Number.isFinite(options.nsr))) throw new RangeError(`nsr must be finite and ≥ 0, got ${options.nsr}`);
	if (options.iterations !== undefined && (!Number.isInteger(options.iterations) || options.iterations < 0)) throw new RangeError(`iterations must be a non-negative integer, got ${options.iterations}`);
	if (options.tv !== undefined && !(options.tv >= 0 && options.tv < 0.25)) throw new RangeError(`tv must lie in [0, 0.25), got ${options.tv}`);
	if (options.method === 'rl' && options.tv) throw new RangeError("tv applies to method 'rltv', not 'rl'");
}

/**
 * Restore a photograph: validate the kernel spec, build the PSF, decode to linear light (default),
 * restore every channel with the same resolved settings, clip to [0, 1], re-encode, and return the
 * run record needed to replay the result bit for bit with the same ENGINE_VERSION.
 * Auto mode and automatic NSR use only the input (Immerkær noise estimate) and the kernel.
 * @throws RangeError for an invalid spec or options, or an image smaller than the kernel.
 */
export function restore(img: RasterImage, kernel: KernelSpec, options: RestoreOptions, hooks: RestoreHooks = {}): { image: RasterImage; record: RunRecord } {
	const parsed = kernelSpecSchema.safeParse(kernel);
	if (!parsed.success) throw new RangeError(`invalid kernel spec: ${parsed.error.issues.map((i) => i.message).join('; ')}`);
	if (img.planes.length !== 1 && img.planes.length !== 3) throw new RangeError(`image must have 1 or 3 planes, got ${img.planes.length}`);
	for (const p of img.planes) {
		if (p.shape[0] !== img.height || p.shape[1] !== img.width) throw new RangeError('plane size differs from the image size');
	}
	validateOptions(options);
	const psf = buildKernel(parsed.data);
	const linearLight = options.linearLight ?? true;
	const fft = hooks.fft ?? defaultFftBackend();
	const working = linearLight ? imageToLinear(img, fft.parallel) : img;
	const sigmas = working.planes.map((p) => estimateNoiseSigma(p));
	const noiseSigma = sigmas.reduce((a, b) => a + b, 0) / sigmas.length;
	const { settings, auto } = resolveSettings(options, noiseSigma, psf, () => meanPlane(working.planes));
	const channels = working.planes.length;
	const unitsPerChannel = settings.method === 'wiener' ? 1 : Math.max(1, settings.iterations);
	const total = channels * unitsPerChannel;
	let iterationsRun: number | undefined;
	const workspace = new Workspace();
	const encode = linearLight && img.transfer === 'srgb';
	const restored = working.planes.map((plane, c) => {
		const result = restorePlane(plane, psf, settings, {
			fft,
			workspace,
			// The working planes are restore()'s own copies unless the input is used as it is.
			overwriteInput: working !== img,
			signal: hooks.signal,
			onProgress: (done) => hooks.onProgress?.(c * unitsPerChannel + done, total)
		});
		if (result.iterationsRun !== undefined) iterationsRun = Math.max(iterationsRun ?? 0, result.iterationsRun);
		return finishPlane(result.plane, encode, fft.parallel);
	});
	const image: RasterImage = { ...working, planes: restored, transfer: encode ? 'srgb' : working.transfer };
	const [kh, kw] = psf.shape;
	const padding =
		settings.method === 'wiener' || settings.wienerStart
			? { mode: settings.boundary === 'circular' ? 'periodic' : 'mirror-pad + edge taper (PSF autocorrelation)', ...wienerPadding(img.height, img.width, [kh, kw], settings.boundary === 'circular' ? 'circular' : 'taper', fft), fft: fft.name }
			: { mode: settings.boundary === 'extended' ? 'extended domain, observed-region data term' : settings.boundary === 'taper' ? 'edge taper, periodic' : 'periodic', margin: settings.boundary === 'extended' ? ([kh - 1, kw - 1] as [number, number]) : undefined, fft: fft.name };
	const record: RunRecord = {
		engineVersion: ENGINE_VERSION,
		method: options.method,
		resolvedMethod: settings.method,
		parameters: { ...settings, ...(auto ? { auto: auto.rationale } : {}), noiseSigmaPerChannel: sigmas, outputClipped: [0, 1] },
		kernel: parsed.data,
		kernelSize: [kh, kw],
		colour: { linearLight, channels },
		boundary: settings.boundary,
		padding,
		input: { width: img.width, height: img.height, clippedFraction: clippedFraction(img), noiseSigma },
		recoverability: recoverability(psf, [img.height, img.width], noiseSigma),
		...(iterationsRun !== undefined ? { iterationsRun } : {})
	};
	return { image, record };
}

/**
 * Values outside [0, 1] cannot be stored in the output file (clipping is recorded in the run record);
 * then re-encode to sRGB when asked. Done in place on the restorer's own new plane, so no further
 * full-size copies exist at the end of a large restoration (they set its peak memory). A plane in a
 * thread pool's shared memory is finished by all its threads, rows split between them.
 */
function finishPlane(plane: Plane, encode: boolean, parallel: BlockParallelism | undefined): Plane {
	const values = planeValues(plane);
	const [height, width] = plane.shape;
	const shared = typeof SharedArrayBuffer !== 'undefined' && values.buffer instanceof SharedArrayBuffer;
	if (parallel?.rows && shared && values.length >= PARALLEL_MIN_VALUES) parallel.rows({ kind: 'finish', values, rows: height, cols: width, encode });
	else finishRange(values, encode, 0, values.length);
	return createPlane(height, width, values);
}

/** Smallest plane whose finishing is split between threads (common practice, no source). */
const PARALLEL_MIN_VALUES = 2 ** 19;

/** {@link finishPlane} of values [first, end): clip to [0, 1], then sRGB-encode if asked. */
export function finishRange(values: Float32Array, encode: boolean, first: number, end: number): void {
	for (let i = first; i < end; i++) values[i] = Math.min(1, Math.max(0, values[i]));
	if (encode) linearToSrgbArray(values.subarray(first, end), values.subarray(first, end));
}

/** Channel mean, used only to pick auto settings once for all channels. */
function meanPlane(planes: Plane[]): Plane {
	if (planes.length === 1) return planes[0];
	const [h, w] = planes[0].shape;
	const out = createPlane(h, w);
	for (const p of planes) {
		const v = planeValues(p);
		for (let i = 0; i < v.length; i++) out.data[i] += v[i] / planes.length;
	}
	return out;
}
