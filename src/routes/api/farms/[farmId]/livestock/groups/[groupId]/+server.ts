import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { deleteGroup, getGroup, listEvents, updateGroup } from '$lib/server/livestock';
import { listMoves } from '$lib/server/livestock-moves';
import { groupPatchSchema } from '$lib/livestock/schemas';

/** The group with its history: events newest first, moves in time order. */
export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const group = await getGroup(access, event.params.groupId);
	return json({ ...group, events: await listEvents(access, group.id), moves: await listMoves(access, { groupId: group.id }) });
});

export const PATCH: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'editPlans');
	await getGroup(access, event.params.groupId);
	return json(await updateGroup(access, event.params.groupId, await readJson(event, groupPatchSchema)));
});

export const DELETE: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'editPlans');
	await deleteGroup(access, event.params.groupId);
	return new Response(null, { status: 204 });
});
