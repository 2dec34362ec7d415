import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { z } from 'zod';
import { api, readJson } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { parseSeason } from '$lib/server/season';
import { setImportMapping } from '$lib/server/yield-import';

export const PUT: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'logRecords');
	const season = parseSeason(event.params.season);
	const { mapping } = await readJson(event, z.object({ mapping: z.unknown() }));
	return json(await setImportMapping(access, event.params.fieldId, season, event.params.importId, mapping), { status: 202 });
});
