import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { clearSessionCookie, endSession } from '$lib/server/auth';

export const load: PageServerLoad = () => redirect(303, '/');

export const actions: Actions = {
	default: async ({ locals, cookies, url }) => {
		if (locals.session) await endSession(locals.session.id);
		clearSessionCookie(cookies, url.protocol === 'https:');
		redirect(303, '/sign-in');
	}
};
