import type { PageServerLoad } from './$types';
import { requireMember } from '$lib/server/access';
import { listFields } from '$lib/server/fields';

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	return { fields: await listFields(access) };
};
