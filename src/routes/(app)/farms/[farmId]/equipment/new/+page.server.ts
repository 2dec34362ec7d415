import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireMember } from '$lib/server/access';
import { createEquipment } from '$lib/server/equipment';
import { EQUIPMENT_KINDS } from '$lib/equipment/types';
import { emptyValues, readEquipmentForm, refusal } from '../equipment-form.server';

export const load: PageServerLoad = async (event) => {
	await requireMember(event, event.params.farmId, 'editPlans');
	const asked = event.url.searchParams.get('kind') ?? 'planter';
	return { values: emptyValues((EQUIPMENT_KINDS as readonly string[]).includes(asked) ? asked : 'planter') };
};

export const actions: Actions = {
	create: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'editPlans');
		const form = await readEquipmentForm(event.request);
		if (!form.ok) return fail(400, { values: form.values, errors: form.errors, message: 'Some values need fixing; see the messages beside them.', conflict: false });
		let id: string;
		try {
			id = (await createEquipment(access, form.input)).id;
		} catch (e) {
			return refusal(e, form.values);
		}
		redirect(303, `/farms/${access.farm.id}/equipment?saved=${id}`);
	}
};
