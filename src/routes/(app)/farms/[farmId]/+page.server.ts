import type { PageServerLoad } from './$types';
import { requireMember } from '$lib/server/access';
import { listMembers } from '$lib/server/team';

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const members = await listMembers(access.farm.id);
	return { memberCount: members.length };
};
