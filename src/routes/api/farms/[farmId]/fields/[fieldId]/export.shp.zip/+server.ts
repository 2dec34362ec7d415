import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { fieldWithSeasonPlan, fileSafe, seasonParam, seasonShapefileZip } from '$lib/server/exports';

export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const season = seasonParam(event.url)!;
	const { field, plan } = await fieldWithSeasonPlan(access, event.params.fieldId, season);
	const bytes = await seasonShapefileZip(field, plan);
	return new Response(new Uint8Array(bytes), {
		headers: {
			'content-type': 'application/zip',
			'content-disposition': `attachment; filename="${fileSafe(field.name)}-${season}-shapefile.zip"`,
			'cache-control': 'no-store'
		}
	});
});
