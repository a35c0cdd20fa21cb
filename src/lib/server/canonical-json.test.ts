import { describe, expect, it } from 'vitest';
import { canonicalJson } from './canonical-json';

describe('canonicalJson', () => {
	it('sorts keys at every depth, so build order does not change the bytes (RFC 8785 §3.2.3)', () => {
		const a = canonicalJson({ b: 1, a: { d: [3, { z: true, y: null }], c: 'x' } });
		const b = canonicalJson({ a: { c: 'x', d: [3, { y: null, z: true }] }, b: 1 });
		expect(a).toBe(b);
		expect(a).toBe('{"a":{"c":"x","d":[3,{"y":null,"z":true}]},"b":1}');
	});

	it('orders keys by UTF-16 code units, not locale (RFC 8785 §3.2.3)', () => {
		// "\u20ac" (€) sorts after "a" and "Z" by code unit; a locale collation would differ.
		expect(canonicalJson({ '\u20ac': 1, a: 2, Z: 3 })).toBe('{"Z":3,"a":2,"\u20ac":1}');
	});

	it('keeps array order and writes numbers in shortest round-trip form (RFC 8785 §3.2.2.3)', () => {
		expect(canonicalJson([3, 1, 2])).toBe('[3,1,2]');
		expect(canonicalJson(1e21)).toBe('1e+21');
		expect(canonicalJson(0.1 + 0.2)).toBe('0.30000000000000004');
	});

	it('refuses NaN and Infinity instead of writing null', () => {
		expect(() => canonicalJson(Number.NaN)).toThrow(RangeError);
		expect(() => canonicalJson({ x: Number.POSITIVE_INFINITY })).toThrow(RangeError);
	});
});
