import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { createProduct, listProducts } from '$lib/server/products';
import { productCreateSchema } from '$lib/schemas/products';

export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	return json(await listProducts(access));
});

export const POST: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'editPlans');
	const input = await readJson(event, productCreateSchema);
	return json(await createProduct(access, input), { status: 201 });
});
