import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { createTour, listTours, sharePath, tourCreateSchema } from '$lib/server/tours';

// The list never carries links: only their hashes are kept.
export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'editPlans');
	return json(await listTours(access), { headers: { 'cache-control': 'no-store' } });
});

export const POST: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'editPlans');
	const input = await readJson(event, tourCreateSchema);
	const { id, token } = await createTour(access, input);
	return json({ id, url: new URL(sharePath(token), event.url.origin).href }, { status: 201, headers: { 'cache-control': 'no-store' } });
});
