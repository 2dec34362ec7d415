import type { PageServerLoad } from './$types';
import { requireMember } from '$lib/server/access';
import { farmRecordBook } from '$lib/server/record-pages';

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	return await farmRecordBook(access);
};
