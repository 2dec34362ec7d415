import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireUser } from '$lib/server/access';
import { listFarmsForUser } from '$lib/server/farms';

export const GET: RequestHandler = api(async (event) => {
	const user = requireUser(event);
	return json(await listFarmsForUser(user.id));
});
