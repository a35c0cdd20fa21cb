import { error, json } from '@sveltejs/kit';
import { config } from '$lib/server/config';
import { readMailbox } from '$lib/server/dev-mailbox';
import type { RequestHandler } from './$types';

/** Development and tests only: messages the fake SMTP server received (404 when it is off). */
export const GET: RequestHandler = async ({ url }) => {
	const dir = config().DEV_MAILBOX_DIR;
	if (!dir) error(404, 'The development mailbox is off');
	return json({ messages: await readMailbox(dir, url.searchParams.get('to') ?? undefined) });
};
