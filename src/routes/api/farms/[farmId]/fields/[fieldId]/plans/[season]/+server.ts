import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { getPlan, savePlan } from '$lib/server/plans';
import { planSaveSchema } from '$lib/schemas/plan';
import { parseSeason } from '$lib/server/season';
import { planEtag, planResponse, planStamp } from '$lib/server/plan-response';

export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const variant = event.url.searchParams.get('variant') ?? undefined;
	const season = parseSeason(event.params.season);
	const read = () => getPlan(access, event.params.fieldId, season, variant);
	const stamp = await planStamp(access, event.params.fieldId, season, variant);
	// No stamp: getPlan says why (no such field, or no plan), or finds one saved a moment ago.
	if (!stamp) return json(await read());
	// Every stored digit, as saved: API clients may compare lanes exactly.
	return planResponse(event.request, planEtag('plan', stamp), 'application/json', async () => JSON.stringify(await read()));
});

export const PUT: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'editPlans');
	const season = parseSeason(event.params.season);
	const input = await readJson(event, planSaveSchema);
	return json(await savePlan(access, event.params.fieldId, season, input));
});
