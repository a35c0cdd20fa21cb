/**
 * Recognise an image container by its first bytes, never by its name or declared type.
 * Signatures:
 *  - JPEG: SOI marker FF D8 followed by the next marker's FF (ITU-T T.81 | ISO/IEC 10918-1, Annex B.1).
 *  - PNG: 89 50 4E 47 0D 0A 1A 0A (ISO/IEC 15948:2004 §5.2, PNG signature).
 *  - TIFF: byte order "II" + 42 little-endian, or "MM" + 42 big-endian (TIFF Revision 6.0, Section 2,
 *    Image File Header). BigTIFF (version 43) is not accepted.
 */
import type { ImageFormat } from '../repositories/item.repository';

const SIGNATURES: { format: ImageFormat; bytes: readonly number[] }[] = [
	{ format: 'jpeg', bytes: [0xff, 0xd8, 0xff] },
	{ format: 'png', bytes: [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a] },
	{ format: 'tiff', bytes: [0x49, 0x49, 0x2a, 0x00] },
	{ format: 'tiff', bytes: [0x4d, 0x4d, 0x00, 0x2a] }
];

/** Bytes a caller must keep from the start of a file for {@link sniffFormat} to decide. */
export const SNIFF_BYTES = 8;

export function sniffFormat(head: Uint8Array): ImageFormat | null {
	const match = SIGNATURES.find((s) => head.length >= s.bytes.length && s.bytes.every((b, i) => head[i] === b));
	return match?.format ?? null;
}

export const MEDIA_TYPES: Record<ImageFormat, string> = {
	jpeg: 'image/jpeg',
	png: 'image/png',
	tiff: 'image/tiff'
};
