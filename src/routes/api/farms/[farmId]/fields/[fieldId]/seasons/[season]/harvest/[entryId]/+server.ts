import type { RequestHandler } from './$types';
import { z } from 'zod';
import { api, readJson } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { parseSeason } from '$lib/server/season';
import { deleteHarvestEntry } from '$lib/server/harvest';

export const DELETE: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'logRecords');
	const season = parseSeason(event.params.season);
	const { version } = await readJson(event, z.object({ version: z.number().int().min(1) }));
	await deleteHarvestEntry(access, event.params.fieldId, season, event.params.entryId, version);
	return new Response(null, { status: 204 });
});
