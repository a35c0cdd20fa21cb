/**
 * The pre-flight summary shown before a run: the share of clipped pixels (saturated highlights
 * ring after deconvolution — Whyte, Sivic & Zisserman, IJCV 110(2), 2014) and a noise estimate per
 * channel (Immerkær, CVIU 64(2), 1996), both from the engine, on a working copy of at most
 * WORKING_EDGE pixels on the long edge so a 100-megapixel original is summarised quickly.
 *
 * The copy is subsampled with the nearest-neighbour kernel, not averaged: averaging would lower
 * the noise estimate and turn a clipped highlight's edge into unclipped values, so the summary
 * would understate both hazards. The original is never touched; this copy lives in memory only.
 */
import ndarray from 'ndarray';
import sharp from 'sharp';
import { clippedFraction, estimateNoiseSigma, type Plane, type RasterImage } from '../../imaging';
import { decodeOptions, type ImageHeader } from './inspect';

export const WORKING_EDGE = 2048;

export interface IntakeAnalysis {
	/** Share of pixels saturated in at least one channel, 0–1. */
	clippedFraction: number;
	/** Noise standard deviation per channel, on the 0–1 scale of full code range. */
	noiseSigma: number[];
	/** Size of the working copy the figures come from. */
	workingWidth: number;
	workingHeight: number;
	hasAlpha: boolean;
	pages: number;
	orientation: number | null;
}

async function workingCopy(path: string, header: ImageHeader, maxPixels: number): Promise<RasterImage> {
	const sixteen = header.bitDepth === 16;
	const space = sixteen ? (header.channels === 1 ? 'grey16' : 'rgb16') : header.channels === 1 ? 'b-w' : 'srgb';
	const { data, info } = await sharp(path, decodeOptions(maxPixels))
		.removeAlpha()
		.resize({
			width: WORKING_EDGE,
			height: WORKING_EDGE,
			fit: 'inside',
			withoutEnlargement: true,
			kernel: 'nearest',
			// JPEG shrink-on-load averages DCT blocks; subsample the decoded pixels instead.
			fastShrinkOnLoad: false
		})
		// Naming the source's own space keeps the stored code values (no conversion to 8-bit sRGB).
		.toColourspace(space)
		.raw({ depth: sixteen ? 'ushort' : 'uchar' })
		.toBuffer({ resolveWithObject: true });
	const samples = sixteen
		? new Uint16Array(data.buffer, data.byteOffset, data.length / 2)
		: new Uint8Array(data.buffer, data.byteOffset, data.length);
	const scale = sixteen ? 65535 : 255;
	const planes: Plane[] = [];
	for (let c = 0; c < info.channels; c++) {
		const values = new Float32Array(info.width * info.height);
		for (let i = 0, s = c; i < values.length; i++, s += info.channels) values[i] = samples[s] / scale;
		planes.push(ndarray(values, [info.height, info.width]));
	}
	return { width: info.width, height: info.height, planes, transfer: 'srgb', sourceBitDepth: header.bitDepth };
}

export async function analyse(path: string, header: ImageHeader, maxPixels: number): Promise<IntakeAnalysis> {
	const image = await workingCopy(path, header, maxPixels);
	const measurable = image.width >= 3 && image.height >= 3;
	return {
		clippedFraction: clippedFraction(image),
		// Immerkær's operator needs a 3×3 neighbourhood; a smaller image has no estimate.
		noiseSigma: measurable ? image.planes.map(estimateNoiseSigma) : [],
		workingWidth: image.width,
		workingHeight: image.height,
		hasAlpha: header.hasAlpha,
		pages: header.pages,
		orientation: header.orientation
	};
}
