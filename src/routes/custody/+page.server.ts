import { systemClock } from '$lib/server/clock';
import { db } from '$lib/server/db';
import { custodyService } from '$lib/server/services/custody.service';
import type { Actions } from './$types';

export const actions: Actions = {
	verify: async () => ({ verification: await custodyService(db(), systemClock).verify(), checkedAt: new Date().toISOString() })
};
