import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { moveToNextStretch } from '$lib/server/livestock-moves';
import { nextMoveSchema } from '$lib/livestock/schemas';

/** One action: the group and its shelter on to the next stretch of the lane. */
export const POST: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'logRecords');
	const { acknowledge } = await readJson(event, nextMoveSchema);
	return json(await moveToNextStretch(access, event.params.groupId, acknowledge ?? false), { status: 201 });
});
