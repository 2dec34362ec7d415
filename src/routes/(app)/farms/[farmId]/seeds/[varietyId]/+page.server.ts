import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireMember } from '$lib/server/access';
import { createSeedLot, deleteSeedLot, deleteVariety, updateVariety } from '$lib/server/varieties';
import { AppError } from '$lib/server/errors';
import { emptyLotValues } from '$lib/components/catalog/variety-form';
import { loadVariety, readLotForm, readVarietyForm, refusal, varietyValuesOf } from '../catalog-form.server';

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const variety = await loadVariety(access, event.params.varietyId);
	return { variety, values: varietyValuesOf(variety), lotValues: emptyLotValues() };
};

export const actions: Actions = {
	save: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'editPlans');
		const current = await loadVariety(access, event.params.varietyId);
		const form = await readVarietyForm(event.request);
		if (!form.ok) return fail(400, { form: 'variety', values: form.values, errors: form.errors, message: 'Some values need fixing; see the messages beside them.', conflict: false });
		if (form.version === null) {
			const message = 'The form lost the version it was opened at; reload the page and make the change again.';
			return fail(400, { form: 'variety', values: form.values, errors: { version: [message] }, message, conflict: false });
		}
		try {
			await updateVariety(access, current.id, { ...form.input, version: form.version });
		} catch (e) {
			return refusal(e, 'variety', form.values);
		}
		redirect(303, `/farms/${access.farm.id}/seeds?saved=${current.id}`);
	},
	addLot: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'editPlans');
		const current = await loadVariety(access, event.params.varietyId);
		const form = await readLotForm(event.request);
		if (!form.ok) return fail(400, { form: 'lot', values: form.values, errors: form.errors, message: 'Some values need fixing; see the messages beside them.', conflict: false });
		try {
			await createSeedLot(access, current.id, form.input);
		} catch (e) {
			return refusal(e, 'lot', form.values);
		}
		return { form: 'lot', added: form.input.lotNumber };
	},
	deleteLot: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'editPlans');
		const current = await loadVariety(access, event.params.varietyId);
		const lotId = String((await event.request.formData()).get('lotId') ?? '');
		try {
			await deleteSeedLot(access, current.id, lotId);
		} catch (e) {
			if (e instanceof AppError) return fail(e.status, { form: 'lot', message: e.message });
			throw e;
		}
		return { form: 'lot', removed: true };
	},
	delete: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'editPlans');
		const current = await loadVariety(access, event.params.varietyId);
		await deleteVariety(access, current.id);
		redirect(303, `/farms/${access.farm.id}/seeds?deleted=${encodeURIComponent(`${current.crop} — ${current.name}`)}`);
	}
};
