import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { invalid } from '$lib/server/errors';
import { deleteProduct, getProduct, updateProduct } from '$lib/server/products';
import { productPatchSchema } from '$lib/schemas/products';

export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	return json(await getProduct(access, event.params.productId));
});

export const PATCH: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'editPlans');
	await getProduct(access, event.params.productId); // another farm's product is a 404 whatever the body says
	const patch = await readJson(event, productPatchSchema);
	return json(await updateProduct(access, event.params.productId, patch));
});

/** Soft delete; `?version=` guards against deleting a product someone has just edited. */
export const DELETE: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'editPlans');
	const raw = event.url.searchParams.get('version');
	const version = raw === null ? undefined : Number(raw);
	if (version !== undefined && !(Number.isInteger(version) && version >= 1)) throw invalid('The version is a whole number from 1.', { version: ['The version is a whole number from 1.'] });
	await deleteProduct(access, event.params.productId, version);
	return new Response(null, { status: 204 });
});
