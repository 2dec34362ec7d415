import { fail, redirect } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import type { Actions, PageServerLoad } from './$types';
import { farmNameSchema } from '$lib/schemas/account';
import { requireMember } from '$lib/server/access';
import { deleteFarm, getViewerPrivacy, renameFarm, setViewerPrivacy } from '$lib/server/farms';

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'manageFarm');
	return { form: await superValidate({ name: access.farm.name }, zod4(farmNameSchema)), privacy: await getViewerPrivacy(access.farm.id) };
};

export const actions: Actions = {
	rename: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'manageFarm');
		const form = await superValidate(event.request, zod4(farmNameSchema));
		if (!form.valid) return fail(400, { form });
		await renameFarm(access.farm.id, access.user.id, form.data.name);
		return message(form, 'Farm name saved.');
	},
	// Unchecked boxes are simply absent from the post: absent means "keep hidden".
	privacy: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'manageFarm');
		const data = await event.request.formData();
		const privacy = { memberEmails: data.get('viewersSeeMemberEmails') === 'on', equipment: data.get('viewersSeeEquipment') === 'on' };
		await setViewerPrivacy(access.farm.id, access.user.id, privacy);
		return { privacyMessage: 'What viewers see is saved.' };
	},
	delete: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'manageFarm');
		const data = await event.request.formData();
		if (String(data.get('confirm') ?? '').trim() !== access.farm.name) {
			return fail(400, { deleteError: `Type the farm's name, ${access.farm.name}, exactly to delete it.` });
		}
		await deleteFarm(access.farm.id, access.user.id);
		redirect(303, '/farms');
	}
};
