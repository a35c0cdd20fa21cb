/**
 * The cautions every report and release screen carries. Restoration trades fidelity for
 * perceived quality (Blau & Michaeli, "The Perception-Distortion Tradeoff", CVPR 2018), and
 * frequencies a blur erased cannot be recovered, only regularised.
 */
export const REPORT_CAVEATS: readonly string[] = [
	'Restoration is an aid to interpretation. The restored image is not new evidence and does not replace the original, which is preserved unaltered and identified by its SHA-256 digest.',
	'Deconvolution can create artefacts such as ringing, halos, amplified noise and false edges, most of all near clipped highlights and where the blur model does not fit the whole frame.',
	'Detail absent from the original must not be relied on: spatial frequencies the blur erased are not recovered, only regularised. The recoverability statement in this report gives their share.',
	'No generative or learned model was used. Every step is a documented linear or iterative deconvolution that a comparably trained examiner can repeat from the parameters given here and obtain the same bytes.',
	"Identifications of people, vehicles, number plates or text must not rest on this image alone. Conclusions rest with the laboratory's procedures and qualified review."
];
