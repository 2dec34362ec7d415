import { fail, redirect } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import type { Actions, PageServerLoad } from './$types';
import { resetPasswordSchema } from '$lib/schemas/account';
import { checkPasswordReset, completePasswordReset } from '$lib/server/password-reset';
import { clearSessionCookie } from '$lib/server/auth';

export const load: PageServerLoad = async ({ params }) => {
	const check = await checkPasswordReset(params.token);
	return {
		form: await superValidate(zod4(resetPasswordSchema)),
		problem: check.ok ? null : check.message,
		email: check.ok ? check.email : null
	};
};

export const actions: Actions = {
	default: async ({ request, params, cookies, url }) => {
		const form = await superValidate(request, zod4(resetPasswordSchema));
		const password = form.data.password;
		form.data.password = '';
		form.data.confirm = '';
		if (!form.valid) return fail(400, { form });
		const result = await completePasswordReset(params.token, password);
		if (!result.ok) return message(form, result.message, { status: 400 });
		clearSessionCookie(cookies, url.protocol === 'https:');
		redirect(303, '/sign-in?reset=1');
	}
};
