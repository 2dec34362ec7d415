import { fail } from '@sveltejs/kit';
import { message, setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import type { Actions, PageServerLoad } from './$types';
import { changePasswordSchema } from '$lib/schemas/account';
import { requireUser } from '$lib/server/access';
import { changePassword } from '$lib/server/users';
import { startSession } from '$lib/server/auth';
import { checkSignInAllowed, recordSignInFailure, recordSignInSuccess } from '$lib/server/rate-limit';

export const load: PageServerLoad = async (event) => {
	const user = requireUser(event);
	return { account: { name: user.name, email: user.email }, form: await superValidate(zod4(changePasswordSchema)) };
};

export const actions: Actions = {
	password: async (event) => {
		const user = requireUser(event);
		const form = await superValidate(event.request, zod4(changePasswordSchema));
		const { current, password } = form.data;
		form.data = { current: '', password: '', confirm: '' };
		if (!form.valid) return fail(400, { form });
		// The current password is a sign-in secret too: guessing it here is throttled like sign-in.
		const ip = event.getClientAddress();
		const decision = await checkSignInAllowed(user.email, ip);
		if (!decision.allowed) {
			event.setHeaders({ 'retry-after': String(decision.retryAfterSeconds) });
			return message(form, decision.message!, { status: 429 });
		}
		if (!(await changePassword(user.id, current, password))) {
			await recordSignInFailure(user.email, ip);
			return setError(form, 'current', 'That is not your current password.');
		}
		await recordSignInSuccess(user.email);
		await startSession(event.cookies, user.id, event.url.protocol === 'https:');
		return message(form, 'Password changed. You were signed out everywhere else.');
	}
};
