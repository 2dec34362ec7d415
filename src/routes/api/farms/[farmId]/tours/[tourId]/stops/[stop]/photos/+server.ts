import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { notFound } from '$lib/server/errors';
import { photoFiles, readPhotoForm } from '$lib/server/photos';
import { addStopPhotos } from '$lib/server/tours';

// Multipart, photos in fields named "photo"; the stop is its 1-based number on the tour.
export const POST: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'editPlans');
	if (!/^[1-9]\d{0,2}$/.test(event.params.stop)) throw notFound('tour stop');
	const form = await readPhotoForm(event.request);
	const photos = await addStopPhotos(access, event.params.tourId, Number(event.params.stop), photoFiles(form));
	return json({ photos }, { status: 201 });
});
