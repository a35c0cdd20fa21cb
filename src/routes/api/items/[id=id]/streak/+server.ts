import { json } from '@sveltejs/kit';
import { streakRequestSchema } from '$lib/schemas/kernel-source';
import { db } from '$lib/server/db';
import { apiCall, readJson } from '$lib/server/http';
import { kernelSourceService } from '$lib/server/services/kernel-source.service';
import { storage } from '$lib/server/storage';
import type { RequestHandler } from './$types';

/** `{region}` → `{kernel}`: the PSF a point light's streak recorded in that box of the original (not stored). */
export const POST: RequestHandler = ({ locals, params, request }) =>
	apiCall(async () => {
		const { region } = await readJson(request, streakRequestSchema);
		const kernel = await kernelSourceService(db(), storage()).streak(locals.user!, Number(params.id), region);
		return json({ kernel, region });
	});
