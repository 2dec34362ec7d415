import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { deleteMove, getMove } from '$lib/server/livestock-moves';

export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	return json(await getMove(access, event.params.moveId));
});

export const DELETE: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'logRecords');
	await deleteMove(access, event.params.moveId);
	return new Response(null, { status: 204 });
});
