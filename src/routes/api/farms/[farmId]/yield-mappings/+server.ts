import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { listMappings } from '$lib/server/yield-import';

export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	return json(await listMappings(access));
});
