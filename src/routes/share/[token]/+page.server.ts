import { error } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';
import { NO_TOUR, visitorTour } from '$lib/server/tours';

// No session is read or needed: the link itself is the permission.
export const load: PageServerLoad = async ({ params, setHeaders }) => {
	setHeaders({ 'cache-control': 'no-store', 'referrer-policy': 'no-referrer', 'x-robots-tag': 'noindex, nofollow' });
	const tour = await visitorTour(params.token);
	if (!tour) error(404, { message: NO_TOUR, code: 'not_found' });
	return { tour };
};
