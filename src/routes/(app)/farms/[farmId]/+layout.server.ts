import type { LayoutServerLoad } from './$types';
import { requireMember } from '$lib/server/access';
import { listFarmsForUser } from '$lib/server/farms';
import { CAPABILITY_ROLES, type Capability } from '$lib/permissions';

export const load: LayoutServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const abilities = Object.fromEntries(
		(Object.keys(CAPABILITY_ROLES) as Capability[]).map((c) => [c, access.can(c)])
	) as Record<Capability, boolean>;
	return {
		farm: access.farm,
		role: access.role,
		abilities,
		farms: await listFarmsForUser(access.user.id)
	};
};
