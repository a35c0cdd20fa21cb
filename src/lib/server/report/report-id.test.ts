import { describe, expect, it } from 'vitest';
import { REPORT_ID_PATTERN } from '../../schemas/review';
import { newReportId } from './report-id';

describe('newReportId', () => {
	it('encodes 80 bits as four groups of Crockford base32 after the year', () => {
		const id = newReportId(new Date('2026-12-02T00:00:00Z'), (n) => Buffer.alloc(n, 0xff));
		expect(id).toBe('SPR-2026-ZZZZ-ZZZZ-ZZZZ-ZZZZ');
		expect(newReportId(new Date('2026-01-01T00:00:00Z'), (n) => Buffer.alloc(n, 0))).toBe('SPR-2026-0000-0000-0000-0000');
	});

	it('matches the pattern the verify form accepts, and differs each time', () => {
		const a = newReportId(new Date());
		expect(a).toMatch(REPORT_ID_PATTERN);
		expect(newReportId(new Date())).not.toBe(a);
	});
});
