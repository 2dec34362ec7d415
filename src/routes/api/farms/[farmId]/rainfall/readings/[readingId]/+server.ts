import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { deleteReading, updateReading } from '$lib/server/rainfall';
import { readingPatchSchema } from '$lib/schemas/rainfall';

export const PATCH: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'logRecords');
	const patch = await readJson(event, readingPatchSchema);
	return json(await updateReading(access, event.params.readingId, patch));
});

export const DELETE: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'logRecords');
	await deleteReading(access, event.params.readingId);
	return new Response(null, { status: 204 });
});
