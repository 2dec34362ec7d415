import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { createGauge, listGauges } from '$lib/server/rainfall';
import { gaugeSchema } from '$lib/schemas/rainfall';

export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	return json({ gauges: await listGauges(access) });
});

/** {name, location: {lng, lat}, fieldId?, notes?} → 201 the gauge. Owners and managers place gauges. */
export const POST: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'editPlans');
	const input = await readJson(event, gaugeSchema);
	return json(await createGauge(access, input), { status: 201 });
});
