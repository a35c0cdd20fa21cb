/**
 * Issue #7's done-criterion on the demo photo: "suggest kernel" proposes the blur the demo was made
 * with, within the issue's targets (straight motion: length within 1 px, angle within 2°). The
 * photo is generated exactly as the seed does, and read through the same service the estimate API
 * calls (decode → linear-light luminance → estimateBlur → JSON), so this is the workbench's answer.
 */
import { describe, expect, it, vi } from 'vitest';
import { formValuesOf } from '../../workbench/suggestion';
import type { ItemRow } from '../repositories/item.repository';
import { estimateService } from '../services/estimate.service';
import type { ObjectStorage } from '../storage';
import { DEMO_BLUR, demoBlurredPhoto } from './demo-photo';

const item = { id: 1, caseId: 1, width: 960, height: 640, storageKey: 'originals/demo' } as ItemRow;
vi.mock('../services/item-access', () => ({ visibleItem: vi.fn(async () => item) }));

const user = { id: 1, role: 'technician' } as Parameters<ReturnType<typeof estimateService>['estimate']>[0];

/** Smallest difference between two line directions; a line at θ and θ + 180° is the same line. */
const angleError = (a: number, b: number) => {
	const d = Math.abs(a - b) % 180;
	return Math.min(d, 180 - d);
};

describe('suggest kernel on the demo photo', () => {
	it('proposes the generator’s straight-motion blur within 1 px and 2°, with its evidence', async () => {
		const { png, kernel: truth } = await demoBlurredPhoto();
		// The generator's own known blur (DEMO_BLUR); the targets are issue #7's.
		if (truth.kind !== 'line') throw new Error('the demo blur is a straight motion');
		expect(truth).toEqual(DEMO_BLUR);
		const storage = { readBuffer: vi.fn(async () => png) } as unknown as ObjectStorage;
		const answer = await estimateService({} as never, storage).estimate(user, item.id, {});

		expect(answer.verdict).toBe('motion');
		const best = answer.proposals[0];
		if (best.kernel.kind !== 'line') throw new Error(`expected a line first, got ${best.kernel.kind}`);
		expect(Math.abs(best.kernel.length - truth.length)).toBeLessThanOrEqual(1);
		expect(angleError(best.kernel.angleDeg, truth.angleDeg)).toBeLessThanOrEqual(2);

		// What "Use this kernel" fills, after rounding to the form's 0.5 steps, is within the targets too.
		const filled = formValuesOf(best.kernel);
		expect(filled?.kernelKind).toBe('line');
		expect(Math.abs(filled!.length! - truth.length)).toBeLessThanOrEqual(1);
		expect(angleError(filled!.angleDeg!, truth.angleDeg)).toBeLessThanOrEqual(2);

		// "Shows why": dark-line marks over a spectrum image, and the fitted profile.
		expect(best.overlay.marks.some((m) => m.kind === 'segment' && m.role === 'zero')).toBe(true);
		expect(best.overlay.profile?.observed.length).toBeGreaterThan(10);
		expect(answer.spectrum?.png).toBeTruthy();
	});
});
