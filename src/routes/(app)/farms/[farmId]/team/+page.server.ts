import { fail, redirect } from '@sveltejs/kit';
import { message, setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { inviteSchema, roleChangeSchema } from '$lib/schemas/account';
import { requireMember } from '$lib/server/access';
import { changeRole, listMembers, listMembersFor, removeMember, setFieldScope, TeamRuleError } from '$lib/server/team';
import { listFields } from '$lib/server/fields';
import { createInvitation, InvitationError, INVITATION_TTL_DAYS, listPendingInvitations, revokeInvitation } from '$lib/server/invitations';
import { appOrigin, sendMail } from '$lib/server/mail';
import { ROLE_LABELS, ROLE_SUMMARIES } from '$lib/permissions';

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const owner = access.can('manageFarm');
	return {
		members: await listMembersFor(access),
		showsEmails: access.sees.memberEmails,
		invitations: owner ? await listPendingInvitations(access.farm.id) : [],
		fields: owner ? (await listFields(access)).map((f) => ({ id: f.id, name: f.name })) : [],
		inviteForm: await superValidate(zod4(inviteSchema), { id: 'invite' })
	};
};

const memberId = z.object({ userId: z.string().uuid() });
const invitationId = z.object({ invitationId: z.string().uuid() });

async function formObject(request: Request) {
	return Object.fromEntries(await request.formData());
}

export const actions: Actions = {
	invite: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'manageFarm');
		const form = await superValidate(event.request, zod4(inviteSchema), { id: 'invite' });
		if (!form.valid) return fail(400, { inviteForm: form });
		let mailed: Awaited<ReturnType<typeof sendMail>>;
		try {
			const inv = await createInvitation(access.farm.id, access.user.id, form.data.email, form.data.role);
			const link = `${appOrigin(event.url.origin)}/invitations/${inv.token}`;
			mailed = await sendMail({
				to: form.data.email,
				subject: `${access.user.name} invites you to ${access.farm.name} on Stripwright`,
				text: `Hello,\n\n${access.user.name} invites you to join ${access.farm.name} on Stripwright as ${ROLE_LABELS[form.data.role]} (${ROLE_SUMMARIES[form.data.role].toLowerCase()}).\n\nOpen this link within ${INVITATION_TTL_DAYS} days to accept:\n\n${link}\n\nIf you do not know this farm, ignore this e-mail.\n`
			});
		} catch (e) {
			if (e instanceof InvitationError) return setError(form, 'email', e.message);
			throw e;
		}
		if (!mailed.sent) {
			return message(form, `Invitation saved, but the mail server did not take the e-mail to ${form.data.email} just now. It will be sent again automatically in about ${mailed.retryMinutes} minute${mailed.retryMinutes === 1 ? '' : 's'}; the link works for ${INVITATION_TTL_DAYS} days.`);
		}
		return message(form, `Invitation sent to ${form.data.email}. The link works for ${INVITATION_TTL_DAYS} days.`);
	},
	changeRole: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'manageFarm');
		const parsed = roleChangeSchema.safeParse(await formObject(event.request));
		if (!parsed.success) return fail(400, { teamError: 'Choose a member and a role.' });
		try {
			await changeRole(access.farm.id, access.user.id, parsed.data.userId, parsed.data.role);
		} catch (e) {
			if (e instanceof TeamRuleError) return fail(400, { teamError: e.message });
			throw e;
		}
		return { teamMessage: 'Role changed.' };
	},
	remove: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'manageFarm');
		const parsed = memberId.safeParse(await formObject(event.request));
		if (!parsed.success) return fail(400, { teamError: 'Unknown member.' });
		try {
			await removeMember(access.farm.id, access.user.id, parsed.data.userId);
		} catch (e) {
			if (e instanceof TeamRuleError) return fail(400, { teamError: e.message });
			throw e;
		}
		if (parsed.data.userId === access.user.id) redirect(303, '/farms');
		return { teamMessage: 'Member removed.' };
	},
	leave: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'read');
		try {
			await removeMember(access.farm.id, access.user.id, access.user.id);
		} catch (e) {
			if (e instanceof TeamRuleError) return fail(400, { teamError: e.message });
			throw e;
		}
		redirect(303, '/farms');
	},
	// Viewers (landlords, visitors) read only the fields granted to them.
	grantFields: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'manageFarm');
		const data = await event.request.formData();
		const parsed = memberId.safeParse({ userId: data.get('userId') });
		if (!parsed.success) return fail(400, { teamError: 'Unknown member.' });
		const member = (await listMembers(access.farm.id)).find((m) => m.userId === parsed.data.userId);
		if (!member || member.role !== 'viewer') return fail(400, { teamError: 'Only viewers have fields granted one by one; other roles see every field.' });
		const farmFields = new Set((await listFields(access)).map((f) => f.id));
		const granted = data.getAll('fieldId').map(String);
		if (granted.some((id) => !farmFields.has(id))) return fail(400, { teamError: 'Some of those fields are not on this farm.' });
		await setFieldScope(access.farm.id, access.user.id, member.userId, granted);
		return { teamMessage: `${member.name} now sees ${granted.length} field${granted.length === 1 ? '' : 's'}.` };
	},
	revoke: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'manageFarm');
		const parsed = invitationId.safeParse(await formObject(event.request));
		if (!parsed.success || !(await revokeInvitation(access.farm.id, access.user.id, parsed.data.invitationId))) {
			return fail(400, { teamError: 'That invitation no longer exists.' });
		}
		return { teamMessage: 'Invitation withdrawn.' };
	}
};
