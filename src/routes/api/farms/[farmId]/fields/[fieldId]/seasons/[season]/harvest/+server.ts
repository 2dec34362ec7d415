import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { parseSeason } from '$lib/server/season';
import { createHarvestEntry, entryJson, harvestEntrySchema, listHarvest } from '$lib/server/harvest';

export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const season = parseSeason(event.params.season);
	return json((await listHarvest(access, event.params.fieldId, season)).map(entryJson));
});

export const POST: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'logRecords');
	const season = parseSeason(event.params.season);
	const input = await readJson(event, harvestEntrySchema);
	return json(entryJson(await createHarvestEntry(access, event.params.fieldId, season, input)), { status: 201 });
});
