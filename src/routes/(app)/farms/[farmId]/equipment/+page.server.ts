import type { PageServerLoad } from './$types';
import { requireMember } from '$lib/server/access';
import { listEquipment } from '$lib/server/equipment';

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	return {
		equipment: await listEquipment(access),
		hiddenFromViewer: !access.sees.equipment,
		saved: event.url.searchParams.get('saved'),
		deleted: event.url.searchParams.get('deleted')
	};
};
