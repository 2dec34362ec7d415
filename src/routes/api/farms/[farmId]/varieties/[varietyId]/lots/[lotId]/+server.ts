import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { deleteSeedLot } from '$lib/server/varieties';

export const DELETE: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'editPlans');
	await deleteSeedLot(access, event.params.varietyId, event.params.lotId);
	return new Response(null, { status: 204 });
});
