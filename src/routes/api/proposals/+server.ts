import { json } from '@sveltejs/kit';
import { apiCall } from '$lib/server/http';
import { proposalJson } from '$lib/server/proposal-json';
import { reviews } from '$lib/server/review';
import type { RequestHandler } from './$types';

/** The review queue: proposals awaiting review, oldest first. */
export const GET: RequestHandler = ({ locals }) =>
	apiCall(async () => json({ proposals: (await reviews().queue(locals.user!)).map(proposalJson) }));
