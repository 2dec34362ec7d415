import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { restoreScoutingNote } from '$lib/server/scouting';
import { parseSeason } from '$lib/server/season';

/** Restores a deleted note → 200 the note (owners and managers). */
export const POST: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'editPlans');
	return json(await restoreScoutingNote(access, event.params.fieldId, parseSeason(event.params.season), event.params.noteId));
});
