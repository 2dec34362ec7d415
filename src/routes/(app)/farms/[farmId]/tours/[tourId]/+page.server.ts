import { fail } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireMember } from '$lib/server/access';
import { AppError, pageError } from '$lib/server/errors';
import { photoFiles, readPhotoForm } from '$lib/server/photos';
import { addStopPhotos, getTour } from '$lib/server/tours';

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'editPlans');
	return { tour: await getTour(access, event.params.tourId).catch(pageError) };
};

export const actions: Actions = {
	photos: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'editPlans');
		try {
			const form = await readPhotoForm(event.request);
			const stop = Number(form.get('stop'));
			if (!Number.isInteger(stop) || stop < 1) return fail(400, { stop, message: 'Choose a stop.' });
			const added = await addStopPhotos(access, event.params.tourId, stop, photoFiles(form));
			return { stop, added: added.length };
		} catch (e) {
			if (e instanceof AppError) return fail(e.status, { message: e.message });
			throw e;
		}
	}
};
