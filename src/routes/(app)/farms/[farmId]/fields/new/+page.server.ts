import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireMember } from '$lib/server/access';
import { createField, listFields } from '$lib/server/fields';
import { readFieldForm } from '$lib/server/field-form';
import { AppError } from '$lib/server/errors';

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'editPlans');
	const fields = await listFields(access);
	return { context: fields.map((f) => ({ name: f.name, boundary: f.boundary })) };
};

export const actions: Actions = {
	default: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'editPlans');
		const form = await readFieldForm(event.request);
		if (!form.ok) return fail(400, { values: form.values, errors: form.errors });
		let id: string;
		try {
			id = (await createField(access, form.input)).id;
		} catch (e) {
			if (e instanceof AppError && e.status === 400) return fail(400, { values: form.values, errors: e.fields ?? { boundary: [e.message] } });
			throw e;
		}
		redirect(303, `/farms/${access.farm.id}/fields/${id}`);
	}
};
