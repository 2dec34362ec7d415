import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { createGroup, listGroups } from '$lib/server/livestock';
import { groupCreateSchema } from '$lib/livestock/schemas';

export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	return json(await listGroups(access));
});

// Owners and managers create groups; crew log moves and events.
export const POST: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'editPlans');
	const input = await readJson(event, groupCreateSchema);
	return json(await createGroup(access, input), { status: 201 });
});
