import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { acceptInvitation, getInvitation, InvitationError, wrongAccountMessage } from '$lib/server/invitations';
import { normalizeEmail } from '$lib/server/users';
import { requireUser } from '$lib/server/access';

export const load: PageServerLoad = async ({ params, locals }) => {
	try {
		const inv = await getInvitation(params.token);
		const wrongAccount = locals.user && normalizeEmail(locals.user.email) !== normalizeEmail(inv.email) ? wrongAccountMessage(inv.email, locals.user.email) : null;
		return { invitation: { farmName: inv.farmName, role: inv.role, email: inv.email, invitedByName: inv.invitedByName, expiresAt: inv.expiresAt }, wrongAccount, problem: null };
	} catch (e) {
		if (e instanceof InvitationError) return { invitation: null, wrongAccount: null, problem: e.message };
		throw e;
	}
};

export const actions: Actions = {
	accept: async (event) => {
		const user = requireUser(event);
		try {
			const inv = await acceptInvitation(event.params.token, user.id);
			redirect(303, `/farms/${inv.farmId}`);
		} catch (e) {
			if (e instanceof InvitationError) return fail(400, { problem: e.message });
			throw e;
		}
	}
};
