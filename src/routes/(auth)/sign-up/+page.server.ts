import { fail, redirect } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import type { Actions, PageServerLoad } from './$types';
import { signUpSchema } from '$lib/schemas/account';
import { requestSignUp, signUpAnswer } from '$lib/server/sign-up';
import { safeRedirectTarget } from '$lib/server/redirects';
import { appOrigin } from '$lib/server/mail';
import { runInBackground } from '$lib/server/background';

export const load: PageServerLoad = async ({ locals, url }) => {
	if (locals.user) redirect(303, safeRedirectTarget(url.searchParams.get('redirectTo')));
	// An invitation link passes the invited address along, since only that address can accept it.
	const email = url.searchParams.get('email')?.slice(0, 254) ?? '';
	return { form: await superValidate({ email }, zod4(signUpSchema), { errors: false }) };
};

export const actions: Actions = {
	default: async (event) => {
		const form = await superValidate(event.request, zod4(signUpSchema));
		const password = form.data.password;
		form.data.password = ''; // never echo a password back
		if (!form.valid) return fail(400, { form });
		// Whether the address is new or taken shows only in the mail sent to it, never in this answer.
		const input = { ...form.data, password, redirectTo: event.url.searchParams.get('redirectTo') };
		runInBackground('sign-up mail', () => requestSignUp(input, appOrigin(event.url.origin)));
		return message(form, signUpAnswer(form.data.email));
	}
};
