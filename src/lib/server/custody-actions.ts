/**
 * Custody actions and their PREMIS 3.0 event types (Library of Congress preservation vocabulary,
 * id.loc.gov/vocabulary/preservation/eventType). Actions with no PREMIS counterpart map to null
 * and are exported under our own name.
 */
export const CUSTODY_ACTIONS = {
	case_created: null,
	case_member_added: null,
	original_received: 'ingestion',
	digests_computed: 'message digest calculation',
	metadata_extracted: 'metadata extraction',
	fixity_checked: 'fixity check',
	run_requested: null,
	run_started: null,
	run_succeeded: 'creation',
	run_failed: null,
	run_cancelled: null,
	replay_checked: 'validation',
	result_viewed: null,
	result_downloaded: 'dissemination',
	original_downloaded: 'dissemination',
	review_submitted: null,
	review_returned: null,
	review_approved: 'validation',
	released: 'dissemination',
	report_downloaded: 'dissemination',
	portal_viewed: null
} as const satisfies Record<string, string | null>;

export type CustodyAction = keyof typeof CUSTODY_ACTIONS;
export const GENESIS_HASH = '0'.repeat(64);
