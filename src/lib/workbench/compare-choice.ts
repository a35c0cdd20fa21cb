/**
 * Which two pictures the before/after viewer compares. The viewer's two selects and the run
 * history's compare boxes edit one shared choice: a left and a right side, each the original or
 * a succeeded run. The right side may be left open (null), meaning "the newest result", so the
 * viewer follows new runs until the technician picks one.
 */
import type { RunSummary } from '../api.svelte';

export const ORIGINAL_SIDE = 'original';
export const runSide = (runId: number) => `run-${runId}`;

/** One picture the viewer can show; every side is drawn on the original preview's pixel grid. */
export interface CompareSide {
	id: string;
	src: string;
	label: string;
	/** The image element's data-testid (tests find the original and the result by it). */
	testid: string;
	sha256: string | null;
}

export interface CompareChoice {
	left: string;
	/** null: the newest result. */
	right: string | null;
}

type RunLike = Pick<RunSummary, 'id' | 'status' | 'resultSha256'>;

/** The succeeded runs, newest first. */
const resultsOf = (runs: RunLike[]) => runs.filter((run) => run.status === 'succeeded').sort((a, b) => b.id - a.id);

/** The original first, then every succeeded run's preview, newest first; none without a preview. */
export function compareSides(item: { previewUrl: string | null; sha256: string }, runs: RunLike[]): CompareSide[] {
	if (!item.previewUrl) return [];
	return [
		{ id: ORIGINAL_SIDE, src: item.previewUrl, label: 'Original', testid: 'original-preview', sha256: item.sha256 },
		...resultsOf(runs).map((run) => ({ id: runSide(run.id), src: `/api/runs/${run.id}/preview`, label: `Run #${run.id}`, testid: 'result-preview', sha256: run.resultSha256 }))
	];
}

/**
 * The two side ids actually shown, from the ids on offer (original first, results newest first).
 * An unknown left falls back to the original; an open or unknown right to the newest result that
 * is not the left (or, with no result, to whatever else there is).
 */
export function resolveChoice(choice: CompareChoice, offered: string[]): { left: string; right: string } {
	const left = offered.includes(choice.left) ? choice.left : offered[0];
	const others = offered.filter((id) => id !== left);
	const right = choice.right !== null && others.includes(choice.right) ? choice.right : (others.find((id) => id !== ORIGINAL_SIDE) ?? others[0] ?? left);
	return { left, right };
}

/** The runs shown in the viewer for these runs (the original counts as offered). */
export function shownRunIds(choice: CompareChoice, runs: RunLike[]): number[] {
	const { left, right } = resolveChoice(choice, [ORIGINAL_SIDE, ...resultsOf(runs).map((run) => runSide(run.id))]);
	return resultsOf(runs)
		.filter((run) => runSide(run.id) === left || runSide(run.id) === right)
		.map((run) => run.id);
}

const isRun = (side: string | null) => side !== null && side !== ORIGINAL_SIDE;

/** The runs ticked for comparison: those chosen explicitly, not the open "newest result". */
export function comparedRunIds(choice: CompareChoice): number[] {
	return [choice.left, choice.right].filter(isRun).map((side) => Number(side!.slice('run-'.length)));
}

/**
 * Tick or untick a run's compare box. A new tick takes the right side; the right side's run moves
 * left when the original held the left, and when two runs are already ticked the left one, the
 * earlier tick, gives way: at most two runs are ticked. Unticking puts the original in that run's
 * place; with no run left ticked, the right side goes back to the newest result.
 */
export function tickRun(choice: CompareChoice, runId: number, on: boolean): CompareChoice {
	const side = runSide(runId);
	const ticked = choice.left === side || choice.right === side;
	if (on) {
		if (ticked) return choice;
		return isRun(choice.right) ? { left: choice.right!, right: side } : { left: choice.left, right: side };
	}
	if (!ticked) return choice;
	const next = { left: choice.left === side ? ORIGINAL_SIDE : choice.left, right: choice.right === side ? ORIGINAL_SIDE : choice.right };
	return isRun(next.left) || isRun(next.right) ? next : { left: ORIGINAL_SIDE, right: null };
}
