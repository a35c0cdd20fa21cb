/** Browser-side reads from the JSON API: its one error shape, and a loader for list views. */
import { toast } from './components/toast.svelte';
import type { Role } from './roles';
import type { CaseKind, CaseStatus } from './schemas/case';

/** A case as GET /api/cases sends it: dates arrive as ISO strings. */
export interface CaseSummary {
	id: number;
	title: string;
	reference: string;
	kind: CaseKind;
	status: CaseStatus;
	description: string | null;
	createdBy: number;
	createdByName: string;
	createdAt: string;
	updatedAt: string;
}

/** A user as GET /api/users sends it. */
export interface UserSummary {
	id: number;
	name: string;
	email: string;
	role: Role;
	active: boolean;
	createdAt: string;
}

export async function getJson<T>(url: string, signal?: AbortSignal): Promise<T> {
	const response = await fetch(url, { signal, headers: { accept: 'application/json' } });
	const body = await response.json().catch(() => null);
	if (!response.ok) {
		throw new Error(body?.error ? `${body.error} (${response.status})` : `The server answered ${response.status}`);
	}
	return body as T;
}

/**
 * One list fetched from the API: the last rows received, whether a request is in flight and
 * the last failure. Failures also go to the toast, so they are noticed even when scrolled away.
 */
export class RemoteList<T> {
	rows: T[] = $state([]);
	loading = $state(true);
	error: string | null = $state(null);
	#inFlight: AbortController | null = null;
	readonly #pick: (body: never) => T[];

	/** `pick` takes the rows out of the response body, e.g. `(body) => body.cases`. */
	constructor(pick: (body: never) => T[]) {
		this.#pick = pick;
	}

	async load(url: string): Promise<void> {
		// A newer query (the next keystroke in a search) supersedes the one still travelling.
		this.#inFlight?.abort();
		const controller = new AbortController();
		this.#inFlight = controller;
		this.loading = true;
		try {
			this.rows = this.#pick(await getJson<never>(url, controller.signal));
			this.error = null;
		} catch (err) {
			if (controller.signal.aborted) return;
			this.error = err instanceof Error ? err.message : String(err);
			toast.error(`Could not load the list: ${this.error}`);
		} finally {
			if (this.#inFlight === controller) this.loading = false;
		}
	}
}

/** An original as the items API sends it (GET /api/items/{id}, the case's item list, an upload's answer). */
export interface ItemSummary {
	id: number;
	caseId: number;
	originalName: string;
	sha256: string;
	md5: string;
	sizeBytes: number;
	format: string;
	width: number;
	height: number;
	bitDepth: number;
	channels: number;
	hasIcc: boolean;
	analysis: { clippedFraction?: number; noiseSigma?: number[] } | null;
	uploadedBy: { id: number; name: string };
	/** A Date when it comes from a page's load, an ISO string from fetch. */
	createdAt: string | Date;
	previewUrl: string | null;
	originalUrl: string;
	duplicate?: boolean;
}

/** A restoration run as GET /api/runs/{id} and GET /api/items/{id}/runs send it. */
export interface RunSummary {
	id: number;
	itemId: number;
	caseId: number;
	requestedBy: { id: number; name: string };
	replayOf: number | null;
	method: string;
	psf: unknown;
	params: unknown;
	engineVersion: string;
	status: 'queued' | 'running' | 'succeeded' | 'failed' | 'cancelled';
	progress: number;
	error: string | null;
	resultSha256: string | null;
	createdAt: string | Date;
	startedAt: string | Date | null;
	finishedAt: string | Date | null;
	replayMatches: boolean | null;
	latestReplay: { id: number; status: string; matches: boolean | null } | null;
}

/** POST JSON to the API; a refusal becomes an Error carrying the server's `{error}` message. */
export async function postJson<T>(url: string, body: unknown = {}): Promise<T> {
	const response = await fetch(url, {
		method: 'POST',
		headers: { accept: 'application/json', 'content-type': 'application/json' },
		body: JSON.stringify(body)
	});
	const answer = await response.json().catch(() => null);
	if (!response.ok) {
		throw new Error(answer?.error ? `${answer.error} (${response.status})` : `The server answered ${response.status}`);
	}
	return answer as T;
}
