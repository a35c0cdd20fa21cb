/**
 * Kernels taken from pictures rather than typed in: the streak an isolated point light left in the
 * photograph itself (a measured PSF of that very exposure), or an uploaded PSF image. Both become
 * the engine's `{kind: 'image'}` spec, which the technician then sends with a run like any other
 * kernel. Nothing is stored and the original is not changed.
 */
import type { Knex } from 'knex';
import sharp from 'sharp';
import { kernelFromStreak, type KernelSpec } from '../../imaging';
import type { SessionUser } from '../../roles';
import type { StreakRequest } from '../../schemas/kernel-source';
import { InvalidError, TooLargeError, UnprocessableError, UnsupportedMediaError } from '../errors';
import { decodeImage, DEFAULT_MAX_PIXELS } from '../imaging/decode';
import { ImageInputError, type ImageInputReason } from '../imaging/errors';
import { PsfError, readPsf } from '../imaging/psf-file';
import { MEDIA_TYPES, sniffFormat } from '../intake/sniff';
import type { ObjectStorage } from '../storage';
import { linearLuminance } from './estimate.service';
import { visibleItem } from './item-access';

export type ImageKernel = Extract<KernelSpec, { kind: 'image' }>;

/** Largest uploaded PSF file: a 1024² 16-bit RGB TIFF uncompressed is 6 MiB. Common practice, no source. */
export const PSF_UPLOAD_MAX_BYTES = 8 * 1024 * 1024;
/**
 * Largest uploaded PSF image, width × height. The kernel itself is at most 257 on a side
 * (KERNEL_LIMITS.maxImageSide) once cropped to its non-zero values; a larger picture is accepted
 * only so a dark margin around the spot need not be trimmed by hand.
 */
export const PSF_UPLOAD_MAX_PIXELS = 1024 * 1024;

type Rect = StreakRequest['region'];

function decodeFailure(reason: ImageInputReason, message: string): Error {
	if (reason === 'too-large') return new TooLargeError(message);
	if (reason === 'unsupported') return new UnsupportedMediaError(message);
	return new UnprocessableError(message);
}

/**
 * Decode only `rect` of an image: libvips crops while it decodes (`extract`), and the crop is
 * handed on as an uncompressed PNG in the source's own sample type and colour space (naming it
 * keeps sharp from reducing 16-bit data to 8-bit sRGB), so the result is exactly the same pixels
 * as that rectangle of decodeImage(bytes), without holding the whole photograph in memory.
 */
export async function decodeRegion(bytes: Uint8Array, rect: Rect) {
	const open = () => sharp(bytes, { limitInputPixels: DEFAULT_MAX_PIXELS, ignoreIcc: true, failOn: 'error' });
	try {
		const meta = await open().metadata();
		const sixteen = meta.depth === 'ushort';
		const grey = meta.space === 'b-w' || meta.space === 'grey16';
		const space = sixteen ? (grey ? 'grey16' : 'rgb16') : grey ? 'b-w' : 'srgb';
		const crop = await open()
			.extract({ left: rect.x, top: rect.y, width: rect.width, height: rect.height })
			.toColourspace(space)
			.png({ compressionLevel: 0 })
			.toBuffer();
		return await decodeImage(crop);
	} catch (err) {
		if (err instanceof ImageInputError) throw decodeFailure(err.reason, err.message);
		// A stored original sharp cannot open at all: it passed intake, so it is damaged.
		throw new UnprocessableError(`the original cannot be read: ${(err as Error).message.split('\n')[0]}`);
	}
}

export function kernelSourceService(knex: Knex, storage: ObjectStorage) {
	return {
		/**
		 * The PSF recorded by a point light's streak inside `region` of an item's original, read in
		 * linear-light luminance (blur is linear in light, not in gamma-encoded values).
		 * @throws NotFoundError for an item the caller cannot see; InvalidError for a region outside
		 *   the image; UnprocessableError when the box holds no streak above the background.
		 */
		async streak(user: SessionUser, itemId: number, region: Rect): Promise<ImageKernel> {
			const item = await visibleItem(knex, user, itemId);
			if (region.x + region.width > item.width || region.y + region.height > item.height) {
				throw new InvalidError('Invalid input', {
					region: [`region ${region.width}×${region.height} at (${region.x}, ${region.y}) must lie inside the ${item.width}×${item.height} image`]
				});
			}
			const { image } = await decodeRegion(await storage.readBuffer(item.storageKey), region);
			const plane = linearLuminance(image);
			try {
				return kernelFromStreak(plane, { x: 0, y: 0, width: region.width, height: region.height });
			} catch (err) {
				if (!(err instanceof RangeError)) throw err;
				throw new UnprocessableError(`No streak found in the box: ${err.message}. Draw the box tightly around one isolated point light's streak.`);
			}
		}
	};
}

/** What an uploaded PSF was, for the technician's notes and the run record. */
export interface UploadedPsf {
	kernel: ImageKernel;
	source: { sha256: string; format: string; width: number; height: number; bitDepth: number; channelReduction: 'none' | 'mean-of-rgb' };
}

/**
 * An uploaded PSF image as an `image` kernel, read by the command line's own reader (readPsf):
 * values as stored, colour reduced to the mean of R, G, B, cropped to its non-zero values,
 * centred and normalised. The type is recognised from the bytes; a JSON kernel spec is refused
 * here because it needs no upload (the run form takes it as it is).
 * @throws UnsupportedMediaError for anything but PNG, TIFF, JPEG; TooLargeError past
 *   PSF_UPLOAD_MAX_PIXELS; UnprocessableError for a damaged image or one that is no kernel.
 */
export async function kernelFromUpload(bytes: Uint8Array, fileName: string): Promise<UploadedPsf> {
	if (bytes.length === 0) throw new InvalidError('The file is empty', { file: ['The file is empty (0 bytes)'] });
	const format = sniffFormat(bytes.subarray(0, 8));
	if (!format) throw new UnsupportedMediaError(`${fileName} is not a PNG, TIFF or JPEG image (recognised from its content)`);
	try {
		const { spec, source } = await readPsf(bytes, fileName, { maxPixels: PSF_UPLOAD_MAX_PIXELS });
		if (spec.kind !== 'image' || source.kind !== 'image') throw new UnsupportedMediaError(`${fileName} is not a ${MEDIA_TYPES[format]} image`);
		const { sha256, decode, channelReduction } = source;
		return {
			kernel: spec,
			source: { sha256, format: decode.format, width: decode.width, height: decode.height, bitDepth: decode.bitDepth, channelReduction }
		};
	} catch (err) {
		if (!(err instanceof PsfError)) throw err;
		if (err.reason === 'too-large') {
			throw new TooLargeError(`${err.message}; a PSF image may have at most ${PSF_UPLOAD_MAX_PIXELS} pixels (1024 × 1024)`);
		}
		throw decodeFailure(err.reason === 'not-a-kernel' ? 'corrupt' : err.reason, err.message);
	}
}
