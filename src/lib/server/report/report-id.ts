/**
 * Report ids: SPR-<year>-XXXX-XXXX-XXXX-XXXX, 80 random bits in Crockford's base32 (no I, L, O,
 * U, so an id read aloud or retyped is not misread). Random rather than sequential, so holding
 * one report tells nothing about any other and ids cannot be guessed on the public verify page.
 */
import { randomBytes } from 'node:crypto';

const ALPHABET = '0123456789ABCDEFGHJKMNPQRSTVWXYZ';

export function newReportId(issuedAt: Date, random: (n: number) => Buffer = randomBytes): string {
	const bytes = random(10);
	let bits = 0;
	let value = 0;
	let out = '';
	for (const byte of bytes) {
		value = (value << 8) | byte;
		bits += 8;
		while (bits >= 5) {
			out += ALPHABET[(value >>> (bits - 5)) & 31];
			bits -= 5;
		}
	}
	return `SPR-${issuedAt.getUTCFullYear()}-${out.match(/.{4}/g)!.join('-')}`;
}
