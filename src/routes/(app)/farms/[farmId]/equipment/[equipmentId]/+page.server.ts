import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireMember } from '$lib/server/access';
import { deleteEquipment, updateEquipment } from '$lib/server/equipment';
import { loadEquipment, readEquipmentForm, refusal, valuesOf } from '../equipment-form.server';

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const equipment = await loadEquipment(access, event.params.equipmentId);
	return { equipment, values: valuesOf(equipment) };
};

export const actions: Actions = {
	save: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'editPlans');
		const current = await loadEquipment(access, event.params.equipmentId);
		const form = await readEquipmentForm(event.request);
		if (!form.ok) return fail(400, { values: form.values, errors: form.errors, message: 'Some values need fixing; see the messages beside them.', conflict: false });
		try {
			await updateEquipment(access, current.id, form.input);
		} catch (e) {
			return refusal(e, form.values);
		}
		redirect(303, `/farms/${access.farm.id}/equipment?saved=${current.id}`);
	},
	delete: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'editPlans');
		const current = await loadEquipment(access, event.params.equipmentId);
		await deleteEquipment(access, current.id);
		redirect(303, `/farms/${access.farm.id}/equipment?deleted=${encodeURIComponent(current.name)}`);
	}
};
