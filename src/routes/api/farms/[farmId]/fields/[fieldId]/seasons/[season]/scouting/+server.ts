import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson, zodFields } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { AppError } from '$lib/server/errors';
import { photoFiles, readPhotoForm } from '$lib/server/photos';
import { createScoutingNote, listScoutingNotes } from '$lib/server/scouting';
import { parseSeason } from '$lib/server/season';
import { scoutingNoteFromForm, scoutingNoteSchema } from '$lib/schemas/scouting';

/** The season's notes, newest first; `?deleted=1` lists the deleted ones instead (owners and managers). */
export const GET: RequestHandler = api(async (event) => {
	const deleted = event.url.searchParams.get('deleted') === '1';
	const access = await requireMember(event, event.params.farmId, deleted ? 'editPlans' : 'read');
	const notes = await listScoutingNotes(access, event.params.fieldId, parseSeason(event.params.season), { deleted });
	return json({ notes });
});

/** JSON, or multipart/form-data with the same fields (standCount as plantsCounted, rowFeetCounted, rowSpacingIn) and up to four `photo` files. */
export const POST: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'scout');
	const season = parseSeason(event.params.season);
	const type = event.request.headers.get('content-type') ?? '';
	if (!type.startsWith('multipart/form-data')) {
		const input = await readJson(event, scoutingNoteSchema);
		return json(await createScoutingNote(access, event.params.fieldId, season, input), { status: 201 });
	}
	const form = await readPhotoForm(event.request);
	const parsed = scoutingNoteSchema.safeParse(scoutingNoteFromForm(form));
	if (!parsed.success) throw new AppError(400, 'Some values are missing or not valid; see fields.', 'invalid', zodFields(parsed.error));
	const photos = await Promise.all(photoFiles(form).map(async (f) => ({ name: f.name || null, bytes: new Uint8Array(await f.arrayBuffer()) })));
	return json(await createScoutingNote(access, event.params.fieldId, season, parsed.data, photos), { status: 201 });
});
