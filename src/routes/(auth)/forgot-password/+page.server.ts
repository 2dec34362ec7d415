import { fail } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import type { Actions, PageServerLoad } from './$types';
import { forgotPasswordSchema } from '$lib/schemas/account';
import { passwordResetAnswer, requestPasswordReset } from '$lib/server/password-reset';
import { appOrigin } from '$lib/server/mail';
import { runInBackground } from '$lib/server/background';

export const load: PageServerLoad = async () => ({ form: await superValidate(zod4(forgotPasswordSchema)) });

export const actions: Actions = {
	default: async ({ request, url }) => {
		const form = await superValidate(request, zod4(forgotPasswordSchema));
		if (!form.valid) return fail(400, { form });
		// The lookup, token and mail happen after the answer, so neither the words nor the time
		// of the answer tell whether the address has an account.
		const email = form.data.email;
		runInBackground('password reset mail', () => requestPasswordReset(email, appOrigin(url.origin)));
		return message(form, passwordResetAnswer(email));
	}
};
