import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireMember } from '$lib/server/access';
import { createProduct } from '$lib/server/products';
import { PRODUCT_KINDS } from '$lib/schemas/products';
import { emptyProductValues } from '$lib/components/catalog/product-form';
import { readProductForm, refusal } from '../product-form.server';

export const load: PageServerLoad = async (event) => {
	await requireMember(event, event.params.farmId, 'editPlans');
	const asked = event.url.searchParams.get('kind') ?? 'herbicide';
	return { values: emptyProductValues((PRODUCT_KINDS as readonly string[]).includes(asked) ? asked : 'herbicide') };
};

export const actions: Actions = {
	create: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'editPlans');
		const form = await readProductForm(event.request);
		if (!form.ok) return fail(400, { values: form.values, errors: form.errors, message: 'Some values need fixing; see the messages beside them.', conflict: false });
		let id: string;
		try {
			id = (await createProduct(access, form.input)).id;
		} catch (e) {
			return refusal(e, form.values);
		}
		redirect(303, `/farms/${access.farm.id}/products?saved=${id}`);
	}
};
