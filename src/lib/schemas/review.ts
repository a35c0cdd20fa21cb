/** Review and release inputs, shared by the forms, the JSON API and the tests. */
import { z } from 'zod';

export const submitProposalSchema = z.object({
	statement: z.string().trim().min(10, 'Say in a sentence or two what was done and why (10 characters at least)').max(4000)
});

export const approveSchema = z.object({
	comment: z.string().trim().max(2000).default('')
});

// A returned proposal must say what to change: the technician acts on the comment.
export const returnSchema = z.object({
	comment: z.string().trim().min(3, 'Say what must change before this can be approved').max(2000)
});

/** Report ids as issued: SPR-<year>-<four groups of four Crockford base32 characters>. */
export const REPORT_ID_PATTERN = /^SPR-\d{4}(-[0-9A-HJKMNP-TV-Z]{4}){4}$/;

export const verifyByIdSchema = z.object({
	reportId: z
		.string()
		.trim()
		.transform((s) => s.toUpperCase())
		.pipe(z.string().regex(REPORT_ID_PATTERN, 'A report id looks like SPR-2026-ABCD-EFGH-JKMN-PQRS'))
});

/** Largest upload the verify page reads: a report is a few megabytes at most. */
export const VERIFY_MAX_BYTES = 50 * 1024 * 1024;

export const verifyByFileSchema = z.object({
	file: z
		.instanceof(File, { message: 'Choose the report PDF' })
		.refine((f) => f.size > 0, 'Choose the report PDF')
		.refine((f) => f.size <= VERIFY_MAX_BYTES, 'A report is never this large')
});
