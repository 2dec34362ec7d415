import { fail, redirect } from '@sveltejs/kit';
import { superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import type { Actions, PageServerLoad } from './$types';
import { farmNameSchema } from '$lib/schemas/account';
import { requireUser } from '$lib/server/access';
import { createFarm, listFarmsForUser } from '$lib/server/farms';

export const load: PageServerLoad = async (event) => {
	const user = requireUser(event);
	return { farms: await listFarmsForUser(user.id), form: await superValidate(zod4(farmNameSchema)) };
};

export const actions: Actions = {
	create: async (event) => {
		const user = requireUser(event);
		const form = await superValidate(event.request, zod4(farmNameSchema));
		if (!form.valid) return fail(400, { form });
		const farm = await createFarm(user.id, form.data.name);
		redirect(303, `/farms/${farm.id}`);
	}
};
