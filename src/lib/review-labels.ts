/** Names of an item's review states, as the screens show them (issue 6 §1). */
export const REVIEW_STATE_LABELS: Record<string, string> = {
	in_progress: 'In progress',
	awaiting_review: 'Awaiting review',
	returned: 'Returned',
	approved: 'Approved',
	released: 'Released',
	superseded: 'Superseded'
};

/** Shown wherever a restored image is shown or released. */
export const RESTORATION_CAUTION =
	"Restoration is an aid to interpretation: it can create artefacts, and detail absent from the original must not be relied on. Conclusions rest with the laboratory's procedures and qualified review.";
