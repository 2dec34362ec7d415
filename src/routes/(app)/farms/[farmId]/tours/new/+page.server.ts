import { fail } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireMember } from '$lib/server/access';
import { AppError } from '$lib/server/errors';
import { listFields } from '$lib/server/fields';
import { readTourForm } from '$lib/server/tour-form';
import { createTour, sharePath } from '$lib/server/tours';

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'editPlans');
	const fields = await listFields(access);
	return { fields: fields.map((f) => ({ id: f.id, name: f.name, boundary: f.boundary })) };
};

export const actions: Actions = {
	default: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'editPlans');
		const form = await readTourForm(event.request, access.farm.timeZone);
		if (!form.ok) return fail(400, { values: form.values, errors: form.errors });
		try {
			const { id, token } = await createTour(access, form.input);
			const url = new URL(sharePath(token), event.url.origin).href;
			// The link is shown this once: only its hash is kept.
			return { created: { id, title: form.input.title, url, printUrl: `${url}/print` } };
		} catch (e) {
			if (e instanceof AppError && e.status === 400) return fail(400, { values: form.values, errors: e.fields ?? { _: [e.message] } });
			throw e;
		}
	}
};
