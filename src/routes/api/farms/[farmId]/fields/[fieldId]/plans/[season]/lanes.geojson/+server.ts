import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { getField } from '$lib/server/fields';
import { getPlan } from '$lib/server/plans';
import { parseSeason } from '$lib/server/season';
import { lanesFeatureCollection } from '$lib/plans/lanes-geojson';
import { planEtag, planResponse } from '$lib/server/plan-response';

export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const season = parseSeason(event.params.season);
	const [field, plan] = await Promise.all([
		getField(access, event.params.fieldId),
		getPlan(access, event.params.fieldId, season, event.url.searchParams.get('variant') ?? undefined)
	]);
	const filename = `${field.name.replace(/[^A-Za-z0-9]+/g, '-')}-${plan.season}-lanes.geojson`;
	return planResponse(event.request, planEtag('lanes', plan, field.name), 'application/geo+json', () => JSON.stringify(lanesFeatureCollection(field.name, plan)), {
		'content-disposition': `attachment; filename="${filename}"`
	});
});
