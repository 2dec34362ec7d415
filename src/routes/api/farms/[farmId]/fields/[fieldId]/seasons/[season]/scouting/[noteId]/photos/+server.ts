import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { photoFiles, readPhotoForm } from '$lib/server/photos';
import { addNotePhotos } from '$lib/server/scouting';
import { parseSeason } from '$lib/server/season';

/** multipart/form-data with up to four files in fields named `photo` → 201 {photos}. */
export const POST: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'scout');
	const season = parseSeason(event.params.season);
	const form = await readPhotoForm(event.request);
	const files = await Promise.all(photoFiles(form).map(async (f) => ({ name: f.name || null, bytes: new Uint8Array(await f.arrayBuffer()) })));
	const photos = await addNotePhotos(access, event.params.fieldId, season, event.params.noteId, files);
	return json({ photos }, { status: 201 });
});
