import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { getPlan, savePlan } from '$lib/server/plans';
import { planSaveSchema } from '$lib/schemas/plan';
import { parseSeason } from '$lib/server/season';

export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const variant = event.url.searchParams.get('variant') ?? undefined;
	return json(await getPlan(access, event.params.fieldId, parseSeason(event.params.season), variant));
});

export const PUT: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'editPlans');
	const season = parseSeason(event.params.season);
	const input = await readJson(event, planSaveSchema);
	return json(await savePlan(access, event.params.fieldId, season, input));
});
