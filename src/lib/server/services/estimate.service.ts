/**
 * Blur estimation for an item: read the original, decode it, reduce it to linear-light luminance
 * and ask the imaging core for kernel proposals (estimateBlur). Nothing is stored and the original
 * is not changed; the proposals are suggestions the technician accepts, adjusts or rejects.
 *
 * Linear light: blur is a linear operation on light, and the spectral zeros the estimators look
 * for are exact only there (camera gamma fills them in; Tai et al., IEEE TPAMI 35(10), 2013,
 * doi:10.1109/TPAMI.2012.266). The engine deconvolves in linear light by default too, so the noise
 * σ and the Wiener NSR reported here are in the units the restoration uses.
 */
import type { Knex } from 'knex';
import sharp from 'sharp';
import { createPlane, srgbToLinear, type Plane, type RasterImage } from '../../imaging';
import { estimateBlur, type BlurEstimate, type OverlayMark } from '../../imaging/estimation';
import type { SessionUser } from '../../roles';
import type { EstimateRequest } from '../../schemas/estimate';
import { InvalidError, TooLargeError, UnprocessableError, UnsupportedMediaError } from '../errors';
import { decodeImage } from '../imaging/decode';
import { ImageInputError } from '../imaging/errors';
import type { ObjectStorage } from '../storage';
import { visibleItem } from './item-access';

/**
 * Luminance weights of linear sRGB (ITU-R BT.709 primaries, as used by IEC 61966-2-1; from memory):
 * Y = 0.2126·R + 0.7152·G + 0.0722·B.
 */
const LUMA = [0.2126, 0.7152, 0.0722] as const;

/**
 * One linear-light luminance plane. Decoded samples are exact multiples of 1/255 or 1/65535, so the
 * sRGB decode is a lookup table over the code values.
 */
export function linearLuminance(image: RasterImage): Plane {
	const max = image.sourceBitDepth === 16 ? 65535 : 255;
	const table = new Float32Array(max + 1);
	for (let code = 0; code <= max; code++) table[code] = image.transfer === 'srgb' ? srgbToLinear(code / max) : code / max;
	const out = createPlane(image.height, image.width);
	const weights = image.planes.length === 1 ? [1] : LUMA;
	image.planes.forEach((plane, c) => {
		const values = plane.data;
		for (let i = 0; i < out.data.length; i++) out.data[i] += weights[c] * table[Math.round(values[i] * max)];
	});
	return out;
}

const r2 = (v: number) => Math.round(v * 100) / 100;
const r4 = (v: number) => Math.round(v * 1e4) / 1e4;

function markJson(mark: OverlayMark) {
	return mark.kind === 'segment'
		? { ...mark, x1: r2(mark.x1), y1: r2(mark.y1), x2: r2(mark.x2), y2: r2(mark.y2) }
		: { ...mark, cx: r2(mark.cx), cy: r2(mark.cy), r: r2(mark.r) };
}

/**
 * The API form of an estimate: the spectrum once, as an 8-bit grey PNG in base64 (about 40–60 kB),
 * and per proposal its kernel spec, confidence, method and overlay marks in that PNG's pixels, with
 * the fitted profile as plain numbers. A few hundred kB at most.
 */
export async function estimateJson(result: BlurEstimate) {
	const { spectrum } = result;
	const png = spectrum
		? (
				await sharp(Buffer.from(Uint8Array.from(spectrum.data, (v) => Math.round(v * 255))), {
					raw: { width: spectrum.width, height: spectrum.height, channels: 1 }
				})
					.png({ compressionLevel: 9 })
					.toBuffer()
			).toString('base64')
		: null;
	return {
		verdict: result.verdict,
		proposals: result.proposals.map((p) => ({
			kernel: p.kernel,
			confidence: p.confidence,
			method: p.method,
			overlay: {
				caption: p.overlay.caption,
				marks: p.overlay.marks.map(markJson),
				profile: p.overlay.profile && {
					axis: p.overlay.profile.axis,
					start: p.overlay.profile.start,
					observed: Array.from(p.overlay.profile.observed, r4),
					model: Array.from(p.overlay.profile.model, r4)
				}
			}
		})),
		noise: result.noise,
		notes: result.notes,
		region: result.region,
		spectrum: spectrum && { width: spectrum.width, height: spectrum.height, centre: spectrum.centre, tiles: spectrum.tiles, png }
	};
}

export type EstimateJson = Awaited<ReturnType<typeof estimateJson>>;

function decodeFailure(err: ImageInputError): Error {
	if (err.reason === 'too-large') return new TooLargeError(err.message);
	if (err.reason === 'unsupported') return new UnsupportedMediaError(err.message);
	return new UnprocessableError(err.message);
}

export function estimateService(knex: Knex, storage: ObjectStorage) {
	return {
		/**
		 * Propose kernels for an item the caller can see, optionally for a region of it.
		 * @throws NotFoundError for an item the caller cannot see; InvalidError for a region outside
		 *   the image; 413/415/422 errors when the stored original cannot be decoded.
		 */
		async estimate(user: SessionUser, itemId: number, input: EstimateRequest): Promise<EstimateJson> {
			const item = await visibleItem(knex, user, itemId);
			const { region } = input;
			if (region && (region.x + region.width > item.width || region.y + region.height > item.height)) {
				throw new InvalidError('Invalid input', {
					region: [`region ${region.width}×${region.height} at (${region.x}, ${region.y}) must lie inside the ${item.width}×${item.height} image`]
				});
			}
			const bytes = await storage.readBuffer(item.storageKey);
			const { image } = await decodeImage(bytes).catch((err: unknown) => {
				throw err instanceof ImageInputError ? decodeFailure(err) : err;
			});
			return estimateJson(estimateBlur(linearLuminance(image), { region }));
		}
	};
}
