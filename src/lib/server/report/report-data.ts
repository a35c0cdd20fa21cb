/** Everything a before/after report states, gathered by the release service and rendered to PDF. */
export interface ReportEvent {
	id: number;
	occurredAt: string; // ISO 8601 UTC
	actor: string;
	role: string;
	action: string;
}

export interface ReportData {
	reportId: string;
	issuedAt: string; // ISO 8601 UTC
	engineVersion: string;
	case: { reference: string; title: string; kind: string };
	item: { id: number; originalName: string; width: number; height: number; bitDepth: number; channels: number };
	digests: {
		original: { sha256: string; md5: string };
		result: { sha256: string; md5: string };
		kernel: { sha256: string };
	};
	run: {
		id: number;
		method: string;
		parameters: Record<string, unknown>;
		kernelSpec: Record<string, unknown>;
		requestedBy: string;
		finishedAt: string;
	};
	statement: string; // the technician's account of what was done and why
	approval: { supervisor: string; approvedAt: string; comment: string };
	releasedBy: string;
	recoverability: { lostFraction: number; note: string };
	custody: ReportEvent[];
	images: {
		/** PNG previews at the same scale, and enlarged crops of the same detail from each. */
		original: Buffer;
		result: Buffer;
		originalDetail: Buffer;
		resultDetail: Buffer;
		detailRegion: { x: number; y: number; width: number; height: number };
		/** The kernel magnified with nearest-neighbour sampling so its pixels stay visible. */
		kernel: Buffer;
		kernelSize: [number, number];
	};
}
