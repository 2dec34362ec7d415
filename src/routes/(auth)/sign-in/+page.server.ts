import { fail, redirect } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import type { Actions, PageServerLoad } from './$types';
import { signInSchema } from '$lib/schemas/account';
import { attemptSignIn } from '$lib/server/sign-in';
import { startSession } from '$lib/server/auth';
import { safeRedirectTarget } from '$lib/server/redirects';

export const load: PageServerLoad = async ({ locals, url }) => {
	if (locals.user) redirect(303, safeRedirectTarget(url.searchParams.get('redirectTo')));
	return { form: await superValidate(zod4(signInSchema)), reset: url.searchParams.has('reset') };
};

export const actions: Actions = {
	default: async (event) => {
		const form = await superValidate(event.request, zod4(signInSchema));
		if (!form.valid) return fail(400, { form: { ...form, data: { ...form.data, password: '' } } });
		const result = await attemptSignIn(form.data.email, form.data.password, event.getClientAddress());
		form.data.password = '';
		if (!result.ok) {
			if (result.retryAfterSeconds) event.setHeaders({ 'retry-after': String(result.retryAfterSeconds) });
			return message(form, result.message, { status: result.status });
		}
		await startSession(event.cookies, result.user.id, event.url.protocol === 'https:');
		redirect(303, safeRedirectTarget(event.url.searchParams.get('redirectTo')));
	}
};
