import { error, fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireMember } from '$lib/server/access';
import { getField, listFields, updateField } from '$lib/server/fields';
import { readFieldForm } from '$lib/server/field-form';
import { AppError, pageError } from '$lib/server/errors';

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'editPlans');
	let field;
	try {
		field = await getField(access, event.params.fieldId);
	} catch (e) {
		if (e instanceof AppError) error(e.status, { message: e.message, code: e.code });
		throw e;
	}
	const others = (await listFields(access)).filter((f) => f.id !== field.id);
	return {
		field,
		context: others.map((f) => ({ name: f.name, boundary: f.boundary })),
		values: {
			name: field.name, farmNumber: field.farmNumber ?? '', tractNumber: field.tractNumber ?? '', fieldNumber: field.fieldNumber ?? '',
			landlord: field.landlord ?? '', notes: field.notes ?? '', shape: JSON.stringify({ boundary: field.boundary, exclusions: field.exclusions }),
			reason: '', version: String(field.version)
		}
	};
};

export const actions: Actions = {
	default: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'editPlans');
		const current = await getField(access, event.params.fieldId).catch(pageError);
		const form = await readFieldForm(event.request);
		if (!form.ok) return fail(400, { values: form.values, errors: form.errors });
		if (form.version === undefined || !Number.isInteger(form.version)) {
			return fail(400, { values: form.values, errors: { version: ['The form lost the version of the field it edits. Reload the page and make the change again.'] } });
		}
		// Only a changed outline becomes a new boundary version.
		const outlineChanged = JSON.stringify({ b: form.input.boundary, x: form.input.exclusions }) !== JSON.stringify({ b: current.boundary, x: current.exclusions });
		try {
			await updateField(access, current.id, {
				name: form.input.name, farmNumber: form.input.farmNumber, tractNumber: form.input.tractNumber, fieldNumber: form.input.fieldNumber,
				landlord: form.input.landlord, notes: form.input.notes, reason: form.reason, version: form.version,
				...(outlineChanged ? { boundary: form.input.boundary, exclusions: form.input.exclusions } : {})
			});
		} catch (e) {
			if (e instanceof AppError && e.status === 409) return fail(409, { values: form.values, errors: {}, conflict: e.message });
			if (e instanceof AppError && e.status === 400) return fail(400, { values: form.values, errors: e.fields ?? { boundary: [e.message] } });
			throw e;
		}
		redirect(303, `/farms/${access.farm.id}/fields/${current.id}`);
	}
};
