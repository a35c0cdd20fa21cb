import { describe, expect, it } from 'vitest';
import { throttledProgress } from './progress';

describe('throttledProgress', () => {
	it('writes at most once per interval and never a lower value', async () => {
		let clock = 0;
		const written: number[] = [];
		const report = throttledProgress(async (p) => written.push(p), 250, () => undefined, () => clock);
		report(1, 10);
		report(2, 10); // same instant: dropped
		clock = 300;
		report(1, 10); // lower than written: dropped
		report(3, 10);
		clock = 600;
		report(10, 10);
		expect(written).toEqual([0.1, 0.3, 1]);
	});

	it('clamps to [0, 1] and survives a zero total', () => {
		const written: number[] = [];
		const report = throttledProgress(async (p) => written.push(p), 0, () => undefined);
		report(5, 0);
		expect(written).toEqual([1]);
	});
});
