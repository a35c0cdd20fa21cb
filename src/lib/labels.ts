/** Words shown for stored codes, shared by badges, filters and pages. */
import type { CaseKind, CaseStatus } from './schemas/case';

export const STATUS_LABELS: Record<CaseStatus, string> = {
	open: 'Open',
	in_review: 'In review',
	released: 'Released',
	closed: 'Closed'
};

export const KIND_LABELS: Record<CaseKind, string> = {
	forensic: 'Forensic',
	archival: 'Archival'
};
