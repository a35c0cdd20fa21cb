/**
 * Two looks at an uploaded image before it is accepted. First the header only (no pixel is
 * decoded), so a decompression bomb — a small file declaring a huge canvas — is refused on its
 * declared width × height. Then one full decode that touches every pixel, so a truncated or
 * corrupt file is refused at intake rather than failing a restoration run later.
 */
import sharp, { type SharpOptions } from 'sharp';
import type { ImageFormat } from '../repositories/item.repository';
import { TooLargeError, UnprocessableError, UnsupportedMediaError } from '../errors';

export interface ImageHeader {
	format: ImageFormat;
	width: number;
	height: number;
	bitDepth: 8 | 16;
	/** Colour channels: 1 (grey) or 3 (RGB); an alpha channel is noted apart. */
	channels: 1 | 3;
	hasAlpha: boolean;
	hasIcc: boolean;
	/** Pages or frames in the file; the engine reads the first. */
	pages: number;
	/** EXIF orientation (1–8) as stored; pixels are kept in stored order. */
	orientation: number | null;
}

/**
 * The options every full decode uses: libvips refuses images above the pixel limit itself, and
 * `failOn: 'error'` makes a truncated or corrupt file an error instead of grey rows — the same
 * strictness as the engine's decoder, so what intake accepts a run can read.
 */
export const decodeOptions = (maxPixels: number): SharpOptions => ({ limitInputPixels: maxPixels, failOn: 'error' });

const SHARP_FORMATS: Record<string, ImageFormat> = { jpeg: 'jpeg', png: 'png', tiff: 'tiff' };

function firstLine(err: unknown): string {
	const message = err instanceof Error ? err.message : String(err);
	return message.split('\n').find((l) => l.trim() !== '')?.trim() ?? 'unknown decoder error';
}

export async function readHeader(path: string, sniffed: ImageFormat, maxPixels: number): Promise<ImageHeader> {
	// limitInputPixels: false — this call reads the header only, and the limit is applied below
	// with a message that names the declared size.
	const meta = await sharp(path, { limitInputPixels: false })
		.metadata()
		.catch((err: unknown) => {
			throw new UnprocessableError(`The image header cannot be read: ${firstLine(err)}`);
		});
	if (SHARP_FORMATS[meta.format ?? ''] !== sniffed) {
		throw new UnprocessableError(`The file starts like ${sniffed.toUpperCase()} but does not decode as one`);
	}
	const { width, height } = meta;
	if (!width || !height) throw new UnprocessableError('The image header declares no dimensions');
	if (width * height > maxPixels) {
		throw new TooLargeError(
			`The image declares ${width} × ${height} = ${width * height} pixels, above the limit of ${maxPixels}`
		);
	}
	const bitDepth = meta.depth === 'uchar' ? 8 : meta.depth === 'ushort' ? 16 : null;
	if (!bitDepth) {
		throw new UnsupportedMediaError(`Samples of type ${meta.depth ?? 'unknown'} are not accepted: send 8- or 16-bit integer images`);
	}
	const colourChannels = meta.channels - (meta.hasAlpha ? 1 : 0);
	const grey = meta.space === 'b-w' || meta.space === 'grey16';
	const rgb = meta.space === 'srgb' || meta.space === 'rgb16' || meta.space === 'rgb';
	if (!((grey && colourChannels === 1) || (rgb && colourChannels === 3))) {
		throw new UnsupportedMediaError(
			`Colour model ${meta.space} with ${meta.channels} channels is not accepted: send greyscale or RGB`
		);
	}
	return {
		format: sniffed,
		width,
		height,
		bitDepth,
		channels: grey ? 1 : 3,
		hasAlpha: meta.hasAlpha,
		hasIcc: Boolean(meta.icc),
		pages: meta.pages ?? 1,
		orientation: meta.orientation ?? null
	};
}

/** Decode every pixel of the first page once (statistics stream through, nothing is kept). */
export async function verifyDecodes(path: string, maxPixels: number): Promise<void> {
	await sharp(path, decodeOptions(maxPixels))
		.stats()
		.catch((err: unknown) => {
			throw new UnprocessableError(`The image is truncated or corrupt: ${firstLine(err)}`);
		});
}
