/**
 * EXIF (and the TIFF tags that carry it) read with exifr, reduced to plain JSON that can be stored
 * in the item row and hashed into the custody ledger: no binary blobs, no thumbnails, no maker
 * notes (vendor-private binary), no structural offset tables.
 */
import exifr from 'exifr';
import type { Json } from '../canonical-json';

/** Arrays longer than this are strip/tile offset tables, not description. */
const MAX_ARRAY = 64;
/** A longer string is an embedded document, not a tag value worth keeping in every read. */
const MAX_STRING = 4096;

export type ExifJson = { [tag: string]: Json };

/**
 * EXIF dates carry no time zone (CIPA DC-008-2019, Exif 2.32: DateTimeOriginal is "YYYY:MM:DD
 * HH:MM:SS"; the zone, when recorded, is in the separate OffsetTime tags), and exifr revives them
 * as local-time Dates. Writing the same local fields back
 * gives an ISO 8601 local date-time, without inventing a zone the camera never recorded.
 */
function localIso(date: Date): string {
	const pad = (n: number, w = 2) => String(n).padStart(w, '0');
	return (
		`${pad(date.getFullYear(), 4)}-${pad(date.getMonth() + 1)}-${pad(date.getDate())}` +
		`T${pad(date.getHours())}:${pad(date.getMinutes())}:${pad(date.getSeconds())}`
	);
}

export function plainJson(value: unknown): Json | undefined {
	if (value === null || typeof value === 'boolean') return value;
	if (typeof value === 'number') return Number.isFinite(value) ? value : undefined;
	if (typeof value === 'string') return value.length <= MAX_STRING ? value : undefined;
	if (value instanceof Date) return Number.isNaN(value.getTime()) ? undefined : localIso(value);
	if (ArrayBuffer.isView(value) || value instanceof ArrayBuffer) return undefined;
	if (Array.isArray(value)) {
		if (value.length > MAX_ARRAY) return undefined;
		const items = value.map(plainJson);
		return items.every((v) => v !== undefined) ? (items as Json[]) : undefined;
	}
	if (typeof value === 'object') {
		const out: ExifJson = {};
		for (const [key, v] of Object.entries(value)) {
			const kept = plainJson(v);
			if (kept !== undefined) out[key] = kept;
		}
		return out;
	}
	return undefined;
}

/** The file's EXIF as plain JSON, or null when it has none. A malformed EXIF block is a metadata
 * problem, not a reason to refuse the photograph: it is reported as `unreadable` instead. */
export async function readExif(path: string): Promise<{ exif: ExifJson | null; status: 'read' | 'none' | 'unreadable' }> {
	try {
		const parsed: unknown = await exifr.parse(path, {
			tiff: true,
			exif: true,
			gps: true,
			interop: false,
			ifd1: false,
			makerNote: false,
			userComment: false,
			xmp: false,
			icc: false,
			iptc: false,
			jfif: false,
			ihdr: false,
			mergeOutput: true
		});
		const exif = plainJson(parsed);
		if (!exif || typeof exif !== 'object' || Array.isArray(exif) || Object.keys(exif).length === 0) {
			return { exif: null, status: 'none' };
		}
		return { exif, status: 'read' };
	} catch {
		return { exif: null, status: 'unreadable' };
	}
}
