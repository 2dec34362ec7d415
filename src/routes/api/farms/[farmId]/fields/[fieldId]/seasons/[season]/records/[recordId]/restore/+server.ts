import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { restoreRecord } from '$lib/server/records';
import { parseSeason } from '$lib/server/season';

// Owners and managers bring deleted records back.
export const POST: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'editPlans');
	return json(await restoreRecord(access, event.params.fieldId, parseSeason(event.params.season), event.params.recordId));
});
