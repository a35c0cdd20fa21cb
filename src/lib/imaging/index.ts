export type { Plane, RasterImage } from './types';
export { createPlane, toContiguous } from './types';
export { ENGINE_VERSION } from './version';
export { type KernelSpec, kernelSpecSchema, KERNEL_LIMITS } from './kernels/spec';
export { buildKernel } from './kernels/build';
export { kernelFromImage, type KernelFromImageOptions } from './kernels/explicit';
export { kernelFromStreak, type KernelFromStreakOptions } from './kernels/streak';
export { kernelCentroid } from './kernels/raster';
export { srgbToLinear, linearToSrgb, toLinear, toSrgb } from './colour';
export { clippedFraction, type ClippedFractionOptions } from './analysis/clipping';
export { estimateNoiseSigma } from './analysis/noise';
export { transferFunction, type TransferFunction } from './analysis/transfer';
export { recoverability, type Recoverability, type RecoverabilityOptions } from './analysis/recoverability';
export type { FftBackend } from './fft/backend';
export type { BlockParallelism } from './fft/parallel';
export { FftJsBackend } from './fft/fftjs-backend';
export { NdarrayFftBackend } from './fft/ndarray-backend';
export { DefaultFftBackend, defaultFftBackend, setDefaultFftBackend } from './fft/default-backend';
export { PffftBackend, PFFFT_PACKAGE } from './fft/pffft-backend';
export { loadPffftBackend, type PffftLoadOptions } from './fft/pffft-loader';
export { rfft2, rfft2Buffer, irfft2, type HalfSpectrum } from './fft/real-fft';
export { nextPowerOfTwo, nextSmoothLength, nextSmoothMultiple, isSmooth } from './fft/fast-size';
export { type ConvolutionJob, convolvePairs, kernelBlockSpectrum, tileLayout } from './restoration/block-convolution';
export { wienerDeconvolve, type WienerOptions } from './restoration/wiener';
export { richardsonLucy, type RichardsonLucyOptions, type RichardsonLucyResult } from './restoration/richardson-lucy';
export { edgeTaper } from './restoration/edge-taper';
export { restore, restorePlane, type RestoreOptions, type RunRecord, type RestoreHooks } from './restoration/restore';
export { chooseAutoSettings, type AutoSettings } from './restoration/auto';
export { psnr } from './metrics/psnr';
export { ssim, type SsimOptions } from './metrics/ssim';
export { randomShakePath, type ShakePathOptions } from './kernels/shake';
export {
	estimateBlur,
	estimateNoise,
	type BlurEstimate,
	type BlurProposal,
	type BlurVerdict,
	type EstimateBlurOptions,
	type NoiseEstimate,
	type Overlay,
	type Region
} from './estimation/index';
