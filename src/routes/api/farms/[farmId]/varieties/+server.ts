import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { createVariety, listVarieties } from '$lib/server/varieties';
import { varietyCreateSchema } from '$lib/schemas/varieties';

export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	return json(await listVarieties(access));
});

export const POST: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'editPlans');
	const input = await readJson(event, varietyCreateSchema);
	return json(await createVariety(access, input), { status: 201 });
});
