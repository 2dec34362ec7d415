import { redirect } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';
import { requireMember } from '$lib/server/access';

// The farm switcher's no-JavaScript path: a GET form with ?to=<farm id>.
export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.url.searchParams.get('to') ?? undefined, 'read');
	redirect(303, `/farms/${access.farm.id}`);
};
