import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { parseSeason } from '$lib/server/season';
import { farmSeason } from '$lib/server/farm-season';

/** The whole farm in one season: each visible field's adopted plan totals, and the farm's. */
export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const season = parseSeason(event.params.season);
	return json(await farmSeason(access, season), { headers: { 'cache-control': 'private, no-store' } });
});
