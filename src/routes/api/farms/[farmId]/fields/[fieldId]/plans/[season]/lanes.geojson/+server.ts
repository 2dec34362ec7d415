import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { getField } from '$lib/server/fields';
import { getPlan } from '$lib/server/plans';
import { parseSeason } from '$lib/server/season';
import { lanesFeatureCollection } from '$lib/plans/lanes-geojson';

export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const field = await getField(access, event.params.fieldId);
	const plan = await getPlan(access, field.id, parseSeason(event.params.season), event.url.searchParams.get('variant') ?? undefined);
	const body = JSON.stringify(lanesFeatureCollection(field.name, plan));
	const filename = `${field.name.replace(/[^A-Za-z0-9]+/g, '-')}-${plan.season}-lanes.geojson`;
	return new Response(body, {
		headers: { 'content-type': 'application/geo+json', 'content-disposition': `attachment; filename="${filename}"` }
	});
});
