import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { deleteGauge, updateGauge } from '$lib/server/rainfall';
import { gaugePatchSchema } from '$lib/schemas/rainfall';

export const PATCH: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'editPlans');
	const patch = await readJson(event, gaugePatchSchema);
	return json(await updateGauge(access, event.params.gaugeId, patch));
});

export const DELETE: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'editPlans');
	await deleteGauge(access, event.params.gaugeId);
	return new Response(null, { status: 204 });
});
