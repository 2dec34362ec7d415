import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { planNextSeason } from '$lib/server/plans';
import { nextSeasonSchema } from '$lib/schemas/plan';
import { parseSeason } from '$lib/server/season';

export const POST: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'editPlans');
	const season = parseSeason(event.params.season);
	const hasBody = Number(event.request.headers.get('content-length') ?? 0) > 0;
	const input = hasBody ? await readJson(event, nextSeasonSchema) : nextSeasonSchema.parse({});
	return json(await planNextSeason(access, event.params.fieldId, season, input), { status: 201 });
});
