import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { deleteScoutingNote, getScoutingNote, updateScoutingNote } from '$lib/server/scouting';
import { parseSeason } from '$lib/server/season';
import { scoutingNotePatchSchema } from '$lib/schemas/scouting';

export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	return json(await getScoutingNote(access, event.params.fieldId, parseSeason(event.params.season), event.params.noteId));
});

export const PATCH: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'scout');
	const patch = await readJson(event, scoutingNotePatchSchema);
	return json(await updateScoutingNote(access, event.params.fieldId, parseSeason(event.params.season), event.params.noteId, patch));
});

export const DELETE: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'scout');
	await deleteScoutingNote(access, event.params.fieldId, parseSeason(event.params.season), event.params.noteId);
	return new Response(null, { status: 204 });
});
