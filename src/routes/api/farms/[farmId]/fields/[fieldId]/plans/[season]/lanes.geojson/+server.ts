import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { getField } from '$lib/server/fields';
import { getPlan } from '$lib/server/plans';
import { parseSeason } from '$lib/server/season';
import { lanesFeatureCollection } from '$lib/plans/lanes-geojson';
import { planEtag, planResponse, planStamp } from '$lib/server/plan-response';

export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const season = parseSeason(event.params.season);
	const variant = event.url.searchParams.get('variant') ?? undefined;
	const read = async () => {
		const [field, plan] = await Promise.all([getField(access, event.params.fieldId), getPlan(access, event.params.fieldId, season, variant)]);
		return { field, plan, body: JSON.stringify(lanesFeatureCollection(field.name, plan)) };
	};
	const stamp = await planStamp(access, event.params.fieldId, season, variant);
	const attachment = (name: string) => ({ 'content-disposition': `attachment; filename="${name.replace(/[^A-Za-z0-9]+/g, '-')}-${season}-lanes.geojson"` });
	if (!stamp) {
		// getPlan says why there is nothing to show, or finds a plan saved a moment ago.
		const { field, body } = await read();
		return new Response(body, { headers: { 'content-type': 'application/geo+json', ...attachment(field.name) } });
	}
	return planResponse(event.request, planEtag('lanes', stamp, stamp.fieldName), 'application/geo+json', async () => (await read()).body, attachment(stamp.fieldName));
});
