/** Helpers for JSON API routes: one error shape `{error, fields?}` and zod-validated bodies. */
import { json } from '@sveltejs/kit';
import type { z } from 'zod';
import { DomainError } from './errors';

export class HttpError extends Error {
	constructor(
		readonly status: number,
		message: string,
		readonly fields?: Record<string, string[]>
	) {
		super(message);
	}
}

/** Field-level messages from a zod error, keyed by dotted path ('' for the whole body). */
export function fieldErrors(issues: z.core.$ZodIssue[]): Record<string, string[]> {
	const fields: Record<string, string[]> = {};
	for (const issue of issues) {
		const key = issue.path.join('.');
		(fields[key] ??= []).push(issue.message);
	}
	return fields;
}

export async function readJson<S extends z.ZodType>(request: Request, schema: S): Promise<z.infer<S>> {
	if (!request.headers.get('content-type')?.includes('application/json')) {
		throw new HttpError(415, 'Send a JSON body with Content-Type: application/json');
	}
	let body: unknown;
	try {
		body = await request.json();
	} catch {
		// '' names the whole body, as in fieldErrors: a client shows it where it shows field messages.
		throw new HttpError(400, 'Malformed JSON body', { '': ['The body is not valid JSON'] });
	}
	return parseWith(schema, body);
}

export function parseWith<S extends z.ZodType>(schema: S, value: unknown): z.infer<S> {
	const parsed = schema.safeParse(value);
	if (!parsed.success) throw new HttpError(400, 'Invalid input', fieldErrors(parsed.error.issues));
	return parsed.data;
}

export function searchParamsObject(url: URL): Record<string, string> {
	return Object.fromEntries(url.searchParams.entries());
}

/** Run an API handler body, mapping domain and HTTP errors to the one JSON error shape. */
export async function apiCall(run: () => Promise<Response>): Promise<Response> {
	try {
		return await run();
	} catch (err) {
		if (err instanceof HttpError || err instanceof DomainError) {
			return json({ error: err.message, ...(err.fields ? { fields: err.fields } : {}) }, { status: err.status });
		}
		throw err;
	}
}
