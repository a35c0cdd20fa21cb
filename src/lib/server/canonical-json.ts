/**
 * Canonical JSON for hashing: object keys sorted by UTF-16 code units at every depth, no
 * whitespace, numbers in JavaScript's shortest round-trip form — the ordering and number rules of
 * the JSON Canonicalization Scheme (RFC 8785, §3.2.3 and §3.2.2.3). Two equal values therefore
 * always serialise to the same bytes, whatever order their keys were built in.
 */
export type Json = null | boolean | number | string | Json[] | { [key: string]: Json };

export function canonicalJson(value: Json): string {
	if (value === null || typeof value === 'boolean' || typeof value === 'string') return JSON.stringify(value);
	if (typeof value === 'number') {
		if (!Number.isFinite(value)) throw new RangeError('canonical JSON has no form for NaN or Infinity');
		return JSON.stringify(value);
	}
	if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`;
	const keys = Object.keys(value)
		.filter((key) => value[key] !== undefined)
		.sort();
	return `{${keys.map((key) => `${JSON.stringify(key)}:${canonicalJson(value[key])}`).join(',')}}`;
}
