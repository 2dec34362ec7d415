import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { checkSignUpLink, confirmSignUp, SignUpLinkError } from '$lib/server/sign-up';
import { startSession } from '$lib/server/auth';

// Opening the link only shows what it is for; the account is made by the button (a POST), so a
// mail scanner that follows links creates nothing.
export const load: PageServerLoad = async ({ params }) => {
	try {
		return { pending: await checkSignUpLink(params.token), problem: null };
	} catch (e) {
		if (e instanceof SignUpLinkError) return { pending: null, problem: e.message };
		throw e;
	}
};

export const actions: Actions = {
	default: async (event) => {
		let next: string;
		try {
			const { user, redirectTo } = await confirmSignUp(event.params.token);
			await startSession(event.cookies, user.id, event.url.protocol === 'https:');
			next = redirectTo;
		} catch (e) {
			if (e instanceof SignUpLinkError) return fail(400, { problem: e.message });
			throw e;
		}
		redirect(303, next);
	}
};
