import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireMember } from '$lib/server/access';
import { deleteProduct, updateProduct } from '$lib/server/products';
import { loadProduct, readProductForm, refusal, valuesOf } from '../product-form.server';

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const product = await loadProduct(access, event.params.productId);
	return { product, values: valuesOf(product) };
};

export const actions: Actions = {
	save: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'editPlans');
		const current = await loadProduct(access, event.params.productId);
		const form = await readProductForm(event.request);
		if (!form.ok) return fail(400, { values: form.values, errors: form.errors, message: 'Some values need fixing; see the messages beside them.', conflict: false });
		if (form.version === null) {
			const message = 'The form lost the version it was opened at; reload the page and make the change again.';
			return fail(400, { values: form.values, errors: { version: [message] }, message, conflict: false });
		}
		try {
			await updateProduct(access, current.id, { ...form.input, version: form.version });
		} catch (e) {
			return refusal(e, form.values);
		}
		redirect(303, `/farms/${access.farm.id}/products?saved=${current.id}`);
	},
	delete: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'editPlans');
		const current = await loadProduct(access, event.params.productId);
		await deleteProduct(access, current.id);
		redirect(303, `/farms/${access.farm.id}/products?deleted=${encodeURIComponent(current.name)}`);
	}
};
