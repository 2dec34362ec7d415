import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { createSeedLot, getVariety, listSeedLots } from '$lib/server/varieties';
import { seedLotCreateSchema } from '$lib/schemas/varieties';

export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	return json(await listSeedLots(access, event.params.varietyId));
});

export const POST: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'editPlans');
	await getVariety(access, event.params.varietyId); // another farm's variety is a 404 whatever the body says
	const input = await readJson(event, seedLotCreateSchema);
	return json(await createSeedLot(access, event.params.varietyId, input), { status: 201 });
});
