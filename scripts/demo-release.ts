/**
 * `tsx scripts/demo-release.ts`: wait (up to 10 minutes) for the demo photo's restoration to
 * succeed on the worker, then take it through review and release with the demo accounts, so the
 * demo client has a report to download. Started in the background by scripts/start.sh.
 */
import { closeDb, db } from '../src/lib/server/db';
import { DEMO_PHOTO_CASE } from '../src/lib/server/demo/demo-restoration';
import { releaseDemoItem } from '../src/lib/server/demo/demo-release';

const POLL_MS = 2000;
const GIVE_UP_MS = 10 * 60 * 1000;

async function demoRun(): Promise<{ id: number; status: string } | undefined> {
	return db()('runs as r')
		.join('items as i', 'i.id', 'r.item_id')
		.join('cases as c', 'c.id', 'i.case_id')
		.where('c.reference', DEMO_PHOTO_CASE)
		.whereNull('r.replay_of')
		.orderBy('r.id')
		.first('r.id', 'r.status');
}

async function main(): Promise<void> {
	const deadline = Date.now() + GIVE_UP_MS;
	for (;;) {
		const run = await demoRun();
		if (!run) return console.log('[demo] no demo run to release');
		if (run.status === 'succeeded') {
			const released = await releaseDemoItem(db(), run.id);
			return console.log(released ? `[demo] run ${run.id} reviewed and released as report ${released.reportId}` : '[demo] demo item already released');
		}
		if (run.status === 'failed' || run.status === 'cancelled') return console.log(`[demo] demo run ${run.id} ${run.status}; nothing released`);
		if (Date.now() > deadline) return console.log('[demo] the demo run did not finish in 10 minutes; nothing released');
		await new Promise((resolve) => setTimeout(resolve, POLL_MS));
	}
}

main()
	.catch((error: unknown) => {
		console.error('[demo]', error instanceof Error ? error.message : error);
		process.exitCode = 1;
	})
	.finally(() => closeDb());
