/** Case schemas shared by the new-case form, the JSON API and the tests. */
import { z } from 'zod';

export const CASE_KINDS = ['forensic', 'archival'] as const;
export const CASE_STATUSES = ['open', 'in_review', 'released', 'closed'] as const;
export type CaseKind = (typeof CASE_KINDS)[number];
export type CaseStatus = (typeof CASE_STATUSES)[number];

export const newCaseSchema = z.object({
	title: z
		.string({ error: 'Title is required' })
		.trim()
		.min(3, 'Title needs at least 3 characters')
		.max(200, 'Title is at most 200 characters'),
	reference: z
		.string({ error: 'Reference is required' })
		.trim()
		.toUpperCase()
		.regex(/^[A-Z0-9][A-Z0-9/-]{2,39}$/, 'Reference: 3–40 letters, digits, "-" or "/", e.g. QC-2026-0142'),
	kind: z.enum(CASE_KINDS, { error: 'Kind is forensic or archival' }),
	description: z.string().trim().max(2000, 'Description is at most 2000 characters').optional().default('')
});
export type NewCase = z.infer<typeof newCaseSchema>;

export const CASE_SORT_KEYS = ['reference', 'title', 'kind', 'status', 'createdAt'] as const;

export const caseListQuerySchema = z.object({
	q: z.string().trim().max(100, 'Search is at most 100 characters').optional(),
	status: z.enum(CASE_STATUSES).optional(),
	kind: z.enum(CASE_KINDS).optional(),
	mine: z
		.enum(['1', 'true'])
		.transform(() => true)
		.optional(),
	sort: z.enum(CASE_SORT_KEYS).default('createdAt'),
	dir: z.enum(['asc', 'desc']).default('desc'),
	limit: z.coerce.number().int().min(1).max(200).default(100)
});
export type CaseListQuery = z.infer<typeof caseListQuerySchema>;

export const addMemberSchema = z.object({
	userId: z.coerce.number({ error: 'Choose a user' }).int().positive('Choose a user')
});
