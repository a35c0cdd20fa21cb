import { error } from '@sveltejs/kit';
import { config } from '$lib/server/config';
import { readMailbox } from '$lib/server/dev-mailbox';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	const dir = config().DEV_MAILBOX_DIR;
	if (!dir) error(404, 'The development mailbox is off');
	return { messages: await readMailbox(dir) };
};
