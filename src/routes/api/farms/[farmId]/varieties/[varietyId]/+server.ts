import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { invalid } from '$lib/server/errors';
import { deleteVariety, getVariety, updateVariety } from '$lib/server/varieties';
import { varietyPatchSchema } from '$lib/schemas/varieties';

export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	return json(await getVariety(access, event.params.varietyId));
});

export const PATCH: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'editPlans');
	await getVariety(access, event.params.varietyId); // another farm's variety is a 404 whatever the body says
	const patch = await readJson(event, varietyPatchSchema);
	return json(await updateVariety(access, event.params.varietyId, patch));
});

/** Soft delete; `?version=` guards against deleting a variety someone has just edited. */
export const DELETE: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'editPlans');
	const raw = event.url.searchParams.get('version');
	const version = raw === null ? undefined : Number(raw);
	if (version !== undefined && !(Number.isInteger(version) && version >= 1)) throw invalid('The version is a whole number from 1.', { version: ['The version is a whole number from 1.'] });
	await deleteVariety(access, event.params.varietyId, version);
	return new Response(null, { status: 204 });
});
