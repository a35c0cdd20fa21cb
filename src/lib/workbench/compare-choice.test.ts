import { describe, expect, it } from 'vitest';
import { ORIGINAL_SIDE, compareSides, comparedRunIds, resolveChoice, runSide, shownRunIds, tickRun, type CompareChoice } from './compare-choice';

const run = (id: number, status: 'succeeded' | 'failed' | 'running' = 'succeeded') => ({ id, status, resultSha256: status === 'succeeded' ? `${id}`.repeat(64).slice(0, 64) : null });
const open: CompareChoice = { left: ORIGINAL_SIDE, right: null };

// The choice rules are our own (issue 5's viewer); no outside source applies.
describe('compareSides', () => {
	it('offers the original first, then succeeded runs newest first', () => {
		const sides = compareSides({ previewUrl: '/api/items/3/preview', sha256: 'ab' }, [run(4), run(9, 'failed'), run(7)]);
		expect(sides.map((side) => side.id)).toEqual([ORIGINAL_SIDE, runSide(7), runSide(4)]);
		expect(sides.map((side) => side.testid)).toEqual(['original-preview', 'result-preview', 'result-preview']);
		expect(sides[1].src).toBe('/api/runs/7/preview');
	});

	it('offers nothing when the original has no preview', () => {
		expect(compareSides({ previewUrl: null, sha256: 'ab' }, [run(1)])).toEqual([]);
	});
});

describe('resolveChoice', () => {
	const offered = [ORIGINAL_SIDE, runSide(9), runSide(5)];

	it('shows the original against the newest result by default', () => {
		expect(resolveChoice(open, offered)).toEqual({ left: ORIGINAL_SIDE, right: runSide(9) });
	});

	it('keeps an explicit choice and falls back from one that is not on offer', () => {
		expect(resolveChoice({ left: runSide(5), right: ORIGINAL_SIDE }, offered)).toEqual({ left: runSide(5), right: ORIGINAL_SIDE });
		expect(resolveChoice({ left: runSide(77), right: runSide(88) }, offered)).toEqual({ left: ORIGINAL_SIDE, right: runSide(9) });
	});

	it('never shows one side against itself when there is another', () => {
		expect(resolveChoice({ left: runSide(9), right: runSide(9) }, offered)).toEqual({ left: runSide(9), right: runSide(5) });
		expect(resolveChoice({ left: runSide(9), right: null }, offered)).toEqual({ left: runSide(9), right: runSide(5) });
	});
});

describe('tickRun', () => {
	it('ticks up to two runs, and a third tick drops the earlier one', () => {
		let choice = tickRun(open, 3, true);
		expect(choice).toEqual({ left: ORIGINAL_SIDE, right: runSide(3) });
		expect(comparedRunIds(choice)).toEqual([3]);
		choice = tickRun(choice, 5, true);
		expect(comparedRunIds(choice)).toEqual([3, 5]);
		choice = tickRun(choice, 8, true);
		expect(comparedRunIds(choice)).toEqual([5, 8]);
		expect(tickRun(choice, 8, true)).toBe(choice);
	});

	it('puts the original in an unticked run’s place, and reopens the choice when no run is left', () => {
		const two = { left: runSide(5), right: runSide(8) };
		expect(tickRun(two, 5, false)).toEqual({ left: ORIGINAL_SIDE, right: runSide(8) });
		expect(tickRun(two, 8, false)).toEqual({ left: runSide(5), right: ORIGINAL_SIDE });
		expect(tickRun({ left: ORIGINAL_SIDE, right: runSide(8) }, 8, false)).toEqual(open);
		expect(tickRun({ left: runSide(8), right: ORIGINAL_SIDE }, 8, false)).toEqual(open);
		expect(tickRun(two, 2, false)).toBe(two);
	});

	it('does not count the open "newest result" as ticked', () => {
		expect(comparedRunIds(open)).toEqual([]);
	});
});

describe('shownRunIds', () => {
	it('names the runs in the viewer, including the default newest result', () => {
		const runs = [run(2), run(6), run(4, 'failed')];
		expect(shownRunIds(open, runs)).toEqual([6]);
		expect(shownRunIds({ left: runSide(2), right: runSide(6) }, runs)).toEqual([6, 2]);
		expect(shownRunIds(open, [])).toEqual([]);
	});
});
