import { config } from '$lib/server/config';
import type { LayoutServerLoad } from './$types';

export const load: LayoutServerLoad = ({ locals }) => ({
	user: locals.user,
	devMailbox: Boolean(config().DEV_MAILBOX_DIR)
});
