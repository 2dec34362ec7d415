import { fail } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { isUuid, requireMember } from '$lib/server/access';
import { AppError } from '$lib/server/errors';
import { listTours, revokeTour } from '$lib/server/tours';

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'editPlans');
	return { tours: await listTours(access) };
};

export const actions: Actions = {
	revoke: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'editPlans');
		const tourId = String((await event.request.formData()).get('tourId') ?? '');
		if (!isUuid(tourId)) return fail(404, { message: 'No tour here: it does not exist or is not on this farm.' });
		try {
			await revokeTour(access, tourId);
		} catch (e) {
			if (e instanceof AppError) return fail(e.status, { message: e.message });
			throw e;
		}
		return { revoked: tourId };
	}
};
