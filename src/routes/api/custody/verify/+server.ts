import { json } from '@sveltejs/kit';
import { systemClock } from '$lib/server/clock';
import { db } from '$lib/server/db';
import { custodyService } from '$lib/server/services/custody.service';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async () => json(await custodyService(db(), systemClock).verify());
