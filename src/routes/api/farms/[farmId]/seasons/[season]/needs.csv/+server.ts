import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { parseSeason } from '$lib/server/season';
import { farmNeeds } from '$lib/server/farm-needs';
import { needsCsv } from '$lib/farm/needs';

/** The season's seed and fertilizer needs as CSV, one row per variety or product. */
export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const season = parseSeason(event.params.season);
	const needs = await farmNeeds(access, season);
	return new Response(needsCsv(season, needs.seed, needs.unrated, needs.fertilizer), {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="needs-${season}.csv"`,
			'cache-control': 'private, no-store'
		}
	});
});
