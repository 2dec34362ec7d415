import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { rainfallSeason } from '$lib/server/rainfall';
import { parseSeason } from '$lib/server/season';

/** The season (calendar year): gauges with totals, weekly sums per gauge (Monday–Sunday on the farm's calendar), readings. */
export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	return json(await rainfallSeason(access, parseSeason(event.params.season)));
});
