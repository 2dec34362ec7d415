import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { parseSeason } from '$lib/server/season';
import { farmSeasonLanes } from '$lib/server/farm-season';

/** Every visible field's adopted lanes for the season, as stored, in one FeatureCollection. */
export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const season = parseSeason(event.params.season);
	const body = JSON.stringify(await farmSeasonLanes(access, season));
	return new Response(body, { headers: { 'content-type': 'application/geo+json', 'cache-control': 'private, no-store' } });
});
