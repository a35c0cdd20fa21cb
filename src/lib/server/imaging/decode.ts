import ndarray from 'ndarray';
import sharp from 'sharp';
import type { Plane, RasterImage } from '../../imaging';
import { ImageInputError } from './errors';

/** Container formats Stillpoint accepts; anything else is refused before decoding pixels. */
export const SUPPORTED_FORMATS = ['png', 'tiff', 'jpeg'] as const;
export type SupportedFormat = (typeof SUPPORTED_FORMATS)[number];

/**
 * Default cap on width × height: 100 megapixels. A 24 MP RGB photo restores within the
 * 2 GB budget of the issue; 100 MP keeps a decompression bomb from exhausting memory.
 * Common practice, no source.
 */
export const DEFAULT_MAX_PIXELS = 100_000_000;

/** What was read from the file besides the pixels; it goes into the run record. */
export interface DecodeInfo {
	format: SupportedFormat;
	width: number;
	height: number;
	/** Colour channels kept: 1 (grey) or 3 (RGB). */
	channels: 1 | 3;
	bitDepth: 8 | 16;
	/** An alpha channel was present and dropped: deconvolution acts on colour only. */
	alphaDropped: boolean;
	/**
	 * An embedded ICC profile was present. Pixels are taken as stored (no colour-management
	 * transform), and treated as sRGB-encoded; the record says so rather than hiding it.
	 */
	iccProfileIgnored: boolean;
	/** EXIF orientation tag as stored (1–8); pixels are kept in stored order, never rotated. */
	orientation?: number;
	/** Number of pages/frames in the file; only the first is decoded. */
	pages: number;
}

export interface DecodeOptions {
	/** @default DEFAULT_MAX_PIXELS */
	maxPixels?: number;
}

/**
 * Decode PNG, TIFF or JPEG bytes into Float32 planes in [0, 1] (value / 255 or / 65535).
 * The type is detected from the content, not a file name. Stored code values are kept
 * exactly: 8-bit data is read as 8-bit, 16-bit as 16-bit, with no colour conversion
 * (libvips' sRGB→rgb16 path is not exact for 8-bit input, so it is avoided).
 */
export async function decodeImage(
	bytes: Uint8Array,
	options: DecodeOptions = {}
): Promise<{ image: RasterImage; info: DecodeInfo }> {
	if (bytes.length === 0) throw new ImageInputError('empty', 'input is empty (0 bytes)');
	const maxPixels = options.maxPixels ?? DEFAULT_MAX_PIXELS;
	// failOn 'error': truncated or corrupt data is refused, while benign warnings (such as a
	// slightly malformed sRGB chunk) do not block a readable photograph.
	const open = () => sharp(bytes, { limitInputPixels: maxPixels, ignoreIcc: true, failOn: 'error' });

	const meta = await open()
		.metadata()
		.catch((e: unknown) => {
			throw translateSharpError(e);
		});
	const format = meta.format as string | undefined;
	if (!format || !(SUPPORTED_FORMATS as readonly string[]).includes(format)) {
		throw new ImageInputError(
			'unsupported',
			`unsupported image format ${format ?? 'unknown'}: expected PNG, TIFF or JPEG`
		);
	}
	const { width, height } = meta;
	if (!width || !height) throw new ImageInputError('corrupt', 'image has no dimensions');
	if (width * height > maxPixels) {
		throw new ImageInputError(
			'too-large',
			`image is ${width}×${height} = ${width * height} pixels, above the limit of ${maxPixels}`
		);
	}
	const bitDepth = bitDepthOf(meta.depth);
	const channels = colourChannelsOf(meta.space, meta.channels);

	let pipeline = open();
	if (meta.hasAlpha) pipeline = pipeline.removeAlpha();
	// Naming the source's own colour space keeps libvips from converting to 8-bit sRGB on output.
	const space = bitDepth === 16 ? (channels === 1 ? 'grey16' : 'rgb16') : channels === 1 ? 'b-w' : 'srgb';
	const depth = bitDepth === 16 ? 'ushort' : 'uchar';
	const raw = await pipeline
		.toColourspace(space)
		.raw({ depth })
		.toBuffer({ resolveWithObject: true })
		.catch((e: unknown) => {
			throw translateSharpError(e);
		});
	// sharp's typings omit `depth` on OutputInfo although it reports it for raw output.
	const got = raw.info as typeof raw.info & { depth?: string };
	if (got.channels !== channels || got.width !== width || got.height !== height || got.depth !== depth) {
		throw new ImageInputError(
			'corrupt',
			`decoder returned ${got.width}×${got.height}×${got.channels} ${got.depth}, expected ${width}×${height}×${channels} ${depth}`
		);
	}
	const samples =
		bitDepth === 16
			? new Uint16Array(raw.data.buffer, raw.data.byteOffset, raw.data.length / 2)
			: new Uint8Array(raw.data.buffer, raw.data.byteOffset, raw.data.length);
	const planes = deinterleave(samples, width, height, channels, bitDepth === 16 ? 65535 : 255);

	return {
		image: { width, height, planes, transfer: 'srgb', sourceBitDepth: bitDepth },
		info: {
			format: format as SupportedFormat,
			width,
			height,
			channels,
			bitDepth,
			alphaDropped: Boolean(meta.hasAlpha),
			iccProfileIgnored: Boolean(meta.icc),
			...(meta.orientation !== undefined ? { orientation: meta.orientation } : {}),
			pages: meta.pages ?? 1
		}
	};
}

function bitDepthOf(depth: string | undefined): 8 | 16 {
	if (depth === 'uchar') return 8;
	if (depth === 'ushort') return 16;
	throw new ImageInputError(
		'unsupported',
		`unsupported sample type ${depth ?? 'unknown'}: expected 8- or 16-bit integers`
	);
}

function colourChannelsOf(space: string | undefined, channels: number | undefined): 1 | 3 {
	if ((space === 'b-w' || space === 'grey16') && (channels === 1 || channels === 2)) return 1;
	if ((space === 'srgb' || space === 'rgb16' || space === 'rgb') && (channels === 3 || channels === 4)) {
		return 3;
	}
	throw new ImageInputError(
		'unsupported',
		`unsupported colour space ${space ?? 'unknown'} with ${channels ?? '?'} channels: expected grey or RGB`
	);
}

function deinterleave(
	samples: Uint8Array | Uint16Array,
	width: number,
	height: number,
	channels: number,
	scale: number
): Plane[] {
	const planes: Plane[] = [];
	for (let c = 0; c < channels; c++) {
		const data = new Float32Array(width * height);
		for (let i = 0, s = c; i < data.length; i++, s += channels) data[i] = samples[s] / scale;
		planes.push(ndarray(data, [height, width]));
	}
	return planes;
}

function translateSharpError(e: unknown): ImageInputError {
	const message = e instanceof Error ? e.message : String(e);
	if (/pixel limit/i.test(message)) return new ImageInputError('too-large', `image exceeds the pixel limit`);
	if (/unsupported image format/i.test(message)) {
		return new ImageInputError('unsupported', 'unsupported image format: expected PNG, TIFF or JPEG');
	}
	// libvips messages can span lines; the CLI promises a one-line error.
	const firstLine = message.split('\n').find((l) => l.trim() !== '') ?? 'unknown decoder error';
	return new ImageInputError('corrupt', `corrupt or truncated image: ${firstLine.trim()}`);
}
