/**
 * The item's runs as the page loaded them, overlaid with what polling GET /api/runs/{id} has
 * learned since: a queued or running run is asked about every POLL_MS until it ends.
 */
import { invalidateAll } from '$app/navigation';
import { getJson, type RunSummary } from '../api.svelte';
import { toast } from '../components/toast.svelte';

export const POLL_MS = 500;

const RANK: Record<RunSummary['status'], number> = { queued: 0, running: 1, succeeded: 2, failed: 2, cancelled: 2 };
export const isActive = (run: RunSummary) => run.status === 'queued' || run.status === 'running';

/** The further-along of two reports on one run; when both have ended, the page's fresh load wins. */
function newer(loaded: RunSummary, polled: RunSummary | undefined): RunSummary {
	if (!polled) return loaded;
	if (RANK[polled.status] !== RANK[loaded.status]) return RANK[polled.status] > RANK[loaded.status] ? polled : loaded;
	if (!isActive(loaded)) return loaded;
	return polled.progress >= loaded.progress ? polled : loaded;
}

export class LiveRuns {
	#polled: Record<number, RunSummary> = $state({});
	readonly #loaded: () => RunSummary[];
	readonly rows: RunSummary[] = $derived.by(() => this.#loaded().map((run) => newer(run, this.#polled[run.id])));
	#busy = false;

	constructor(loaded: () => RunSummary[]) {
		this.#loaded = loaded;
	}

	/** Start polling; returns the function that stops it (an $effect's cleanup). */
	start(): () => void {
		const timer = setInterval(() => void this.#tick(), POLL_MS);
		return () => clearInterval(timer);
	}

	update(run: RunSummary): void {
		this.#polled[run.id] = run;
	}

	async #tick(): Promise<void> {
		const active = this.rows.filter(isActive);
		if (this.#busy || active.length === 0) return;
		this.#busy = true;
		try {
			const answers = await Promise.all(active.map((run) => getJson<RunSummary>(`/api/runs/${run.id}`)));
			for (const run of answers) this.#polled[run.id] = run;
			// A finished replay changes the replayed run's outcome column: reload the list once.
			if (answers.some((run) => run.replayOf !== null && !isActive(run))) await invalidateAll();
		} catch (err) {
			toast.error(`Could not follow the run: ${(err as Error).message}`);
		} finally {
			this.#busy = false;
		}
	}
}
