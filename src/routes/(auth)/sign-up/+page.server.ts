import { fail, redirect } from '@sveltejs/kit';
import { setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import type { Actions, PageServerLoad } from './$types';
import { signUpSchema } from '$lib/schemas/account';
import { createUser, DuplicateEmailError } from '$lib/server/users';
import { startSession } from '$lib/server/auth';
import { safeRedirectTarget } from '$lib/server/redirects';

export const load: PageServerLoad = async ({ locals, url }) => {
	if (locals.user) redirect(303, safeRedirectTarget(url.searchParams.get('redirectTo')));
	return { form: await superValidate(zod4(signUpSchema)) };
};

export const actions: Actions = {
	default: async (event) => {
		const form = await superValidate(event.request, zod4(signUpSchema));
		const password = form.data.password;
		form.data.password = ''; // never echo a password back
		if (!form.valid) return fail(400, { form });
		try {
			const user = await createUser({ email: form.data.email, name: form.data.name, password });
			await startSession(event.cookies, user.id, event.url.protocol === 'https:');
		} catch (e) {
			if (e instanceof DuplicateEmailError) return setError(form, 'email', e.message);
			throw e;
		}
		redirect(303, safeRedirectTarget(event.url.searchParams.get('redirectTo')));
	}
};
