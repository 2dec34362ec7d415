import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { deleteField, getField, updateField } from '$lib/server/fields';
import { fieldPatchSchema } from '$lib/schemas/field';

export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	return json(await getField(access, event.params.fieldId));
});

export const PATCH: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'editPlans');
	await getField(access, event.params.fieldId); // another farm's field is a 404 whatever the body says
	const patch = await readJson(event, fieldPatchSchema);
	return json(await updateField(access, event.params.fieldId, patch));
});

export const DELETE: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'editPlans');
	await deleteField(access, event.params.fieldId);
	return new Response(null, { status: 204 });
});
