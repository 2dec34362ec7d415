import { fail } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import type { Actions, PageServerLoad } from './$types';
import { forgotPasswordSchema } from '$lib/schemas/account';
import { getUserFromEmail } from '$lib/server/users';
import { createPasswordReset, RESET_TTL_MINUTES } from '$lib/server/password-reset';
import { appOrigin, sendMail } from '$lib/server/mail';

export const load: PageServerLoad = async () => ({ form: await superValidate(zod4(forgotPasswordSchema)) });

export const actions: Actions = {
	default: async ({ request, url }) => {
		const form = await superValidate(request, zod4(forgotPasswordSchema));
		if (!form.valid) return fail(400, { form });
		const user = await getUserFromEmail(form.data.email);
		if (user) {
			const token = await createPasswordReset(user.id);
			const link = `${appOrigin(url.origin)}/reset-password/${token}`;
			await sendMail({
				to: user.email,
				subject: 'Reset your Stripwright password',
				text: `Hello ${user.name},\n\nSomeone (hopefully you) asked to reset the password of your Stripwright account.\nOpen this link within ${RESET_TTL_MINUTES} minutes to choose a new password; it works once:\n\n${link}\n\nIf you did not ask, ignore this e-mail: your password stays as it is.\n`
			});
		}
		// Same answer either way, so the page does not reveal which e-mails have accounts.
		return message(form, `If an account uses ${form.data.email}, a reset link is on its way. It works once, for ${RESET_TTL_MINUTES} minutes.`);
	}
};
