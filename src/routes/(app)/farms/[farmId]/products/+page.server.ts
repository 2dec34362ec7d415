import type { PageServerLoad } from './$types';
import { requireMember } from '$lib/server/access';
import { listProducts } from '$lib/server/products';

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	return {
		products: await listProducts(access),
		saved: event.url.searchParams.get('saved'),
		deleted: event.url.searchParams.get('deleted')
	};
};
