import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireMember } from '$lib/server/access';
import { createVariety, listVarieties } from '$lib/server/varieties';
import { emptyVarietyValues } from '$lib/components/catalog/variety-form';
import { readVarietyForm, refusal } from './catalog-form.server';

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	return {
		varieties: await listVarieties(access),
		values: emptyVarietyValues(),
		saved: event.url.searchParams.get('saved'),
		deleted: event.url.searchParams.get('deleted')
	};
};

export const actions: Actions = {
	create: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'editPlans');
		const form = await readVarietyForm(event.request);
		if (!form.ok) return fail(400, { form: 'variety', values: form.values, errors: form.errors, message: 'Some values need fixing; see the messages beside them.', conflict: false });
		let id: string;
		try {
			id = (await createVariety(access, form.input)).id;
		} catch (e) {
			return refusal(e, 'variety', form.values);
		}
		redirect(303, `/farms/${access.farm.id}/seeds?saved=${id}#variety-${id}`);
	}
};
