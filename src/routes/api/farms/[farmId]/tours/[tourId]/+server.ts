import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { revokeTour } from '$lib/server/tours';

/** Revokes the tour's share link; the visitor page answers 404 from then on. */
export const DELETE: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'editPlans');
	return json(await revokeTour(access, event.params.tourId));
});
