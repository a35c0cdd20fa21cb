/**
 * Hand-made files for intake tests (unit and integration): what sharp will not write on purpose.
 */
import { deflateSync } from 'node:zlib';

const CRC_TABLE = Array.from({ length: 256 }, (_, n) => {
	let c = n;
	for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
	return c >>> 0;
});

/**
 * CRC-32 as the PNG specification defines it for chunks (ISO/IEC 15948:2004 §5.5 and Annex D
 * sample code: polynomial 0xEDB88320 reflected, initial and final XOR 0xFFFFFFFF).
 */
export function crc32(bytes: Uint8Array): number {
	let c = 0xffffffff;
	for (const b of bytes) c = CRC_TABLE[(c ^ b) & 0xff] ^ (c >>> 8);
	return (c ^ 0xffffffff) >>> 0;
}

function chunk(type: string, data: Buffer): Buffer {
	const length = Buffer.alloc(4);
	length.writeUInt32BE(data.length);
	const typeAndData = Buffer.concat([Buffer.from(type, 'latin1'), data]);
	const crc = Buffer.alloc(4);
	crc.writeUInt32BE(crc32(typeAndData));
	return Buffer.concat([length, typeAndData, crc]);
}

/**
 * A small, well-formed PNG whose IHDR declares `width` × `height` 8-bit RGB pixels (ISO/IEC 15948
 * §11.2.2) but whose IDAT holds only one filtered row: a decompression-bomb header. Only a decoder
 * that trusts the header would try to allocate the declared canvas.
 */
export function pngDeclaring(width: number, height: number): Buffer {
	const ihdr = Buffer.alloc(13);
	ihdr.writeUInt32BE(width, 0);
	ihdr.writeUInt32BE(height, 4);
	ihdr.set([8, 2, 0, 0, 0], 8); // bit depth 8, colour type 2 (RGB), deflate, adaptive filter, no interlace
	const oneRow = deflateSync(Buffer.alloc(1 + Math.min(width, 4096) * 3));
	return Buffer.concat([
		Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
		chunk('IHDR', ihdr),
		chunk('IDAT', oneRow),
		chunk('IEND', Buffer.alloc(0))
	]);
}
