import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { parseSeason } from '$lib/server/season';
import { seasonSummary } from '$lib/server/farm-season';

/** The season's farm totals: crops, headland, exclusions, lane kinds, change and rotation. */
export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const season = parseSeason(event.params.season);
	return json(await seasonSummary(access, season), { headers: { 'cache-control': 'private, no-store' } });
});
