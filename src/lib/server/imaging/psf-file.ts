import { createHash } from 'node:crypto';
import ndarray from 'ndarray';
import { kernelFromImage, kernelSpecSchema, type KernelSpec } from '../../imaging';
import { decodeImage, type DecodeInfo } from './decode';
import { ImageInputError, type ImageInputReason } from './errors';

/**
 * Thrown when a PSF file is not a usable kernel; the message fits on one line. `reason` says why
 * (the image could not be read, or it was read but is not a kernel) so a server maps it to a status.
 */
export class PsfError extends Error {
	constructor(
		message: string,
		readonly reason: ImageInputReason | 'not-a-kernel' = 'not-a-kernel'
	) {
		super(message);
		this.name = 'PsfError';
	}
}

export interface ReadPsfOptions {
	/** Cap on an image PSF's width × height. @default DEFAULT_MAX_PIXELS of decodeImage */
	maxPixels?: number;
}

/** Where the kernel of a run came from; it goes into the run record beside the spec. */
export type PsfSource =
	| { kind: 'json'; file: string; sha256: string }
	| {
			kind: 'image';
			file: string;
			sha256: string;
			decode: DecodeInfo;
			/** How colour planes were reduced to one: a PSF is a single intensity distribution. */
			channelReduction: 'none' | 'mean-of-rgb';
	  };

/**
 * Read a PSF given as a JSON kernel spec or as an image (PNG, TIFF, JPEG of any size). The type
 * is decided by content: a document whose first non-blank byte is `{` is JSON, anything else
 * must decode as an image. Image values are used as stored (no gamma decoding) and normalised
 * by their sum by the engine's kernelFromImage.
 */
export async function readPsf(bytes: Uint8Array, file: string, options: ReadPsfOptions = {}): Promise<{ spec: KernelSpec; source: PsfSource }> {
	const sha256 = createHash('sha256').update(bytes).digest('hex');
	if (looksLikeJson(bytes)) {
		let doc: unknown;
		try {
			doc = JSON.parse(new TextDecoder('utf-8', { fatal: true }).decode(bytes));
		} catch (e) {
			throw new PsfError(`PSF file ${file} is not valid JSON: ${(e as Error).message}`);
		}
		const parsed = kernelSpecSchema.safeParse(doc);
		if (!parsed.success) {
			throw new PsfError(`PSF file ${file} is not a kernel spec: ${parsed.error.issues.map((i) => i.message).join('; ')}`);
		}
		return { spec: parsed.data, source: { kind: 'json', file, sha256 } };
	}
	let decoded;
	try {
		decoded = await decodeImage(bytes, { maxPixels: options.maxPixels });
	} catch (e) {
		if (e instanceof ImageInputError) throw new PsfError(`PSF file ${file}: ${e.message}`, e.reason);
		throw e;
	}
	const { image, info } = decoded;
	const plane = image.planes.length === 1 ? image.planes[0] : meanOfPlanes(image.planes, image.height, image.width);
	try {
		const spec = kernelFromImage(plane, { origin: 'upload' });
		return {
			spec,
			source: { kind: 'image', file, sha256, decode: info, channelReduction: image.planes.length === 1 ? 'none' : 'mean-of-rgb' }
		};
	} catch (e) {
		if (e instanceof RangeError) throw new PsfError(`PSF image ${file} is not a usable kernel: ${e.message}`);
		throw e;
	}
}

function looksLikeJson(bytes: Uint8Array): boolean {
	for (const b of bytes) {
		if (b === 0x20 || b === 0x09 || b === 0x0a || b === 0x0d || b === 0xef || b === 0xbb || b === 0xbf) continue;
		return b === 0x7b;
	}
	return false;
}

function meanOfPlanes(planes: { data: Float32Array }[], height: number, width: number) {
	const out = new Float32Array(height * width);
	for (const p of planes) for (let i = 0; i < out.length; i++) out[i] += p.data[i] / planes.length;
	return ndarray(out, [height, width]);
}
