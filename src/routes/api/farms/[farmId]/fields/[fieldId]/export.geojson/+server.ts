import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { fieldWithSeasonPlan, fileSafe, seasonFeatures, seasonParam } from '$lib/server/exports';

export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const season = seasonParam(event.url)!;
	const { field, plan } = await fieldWithSeasonPlan(access, event.params.fieldId, season);
	return new Response(JSON.stringify(seasonFeatures(field, plan)), {
		headers: {
			'content-type': 'application/geo+json',
			'content-disposition': `attachment; filename="${fileSafe(field.name)}-${season}.geojson"`,
			'cache-control': 'no-store'
		}
	});
});
