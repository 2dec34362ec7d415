import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { parseSeason } from '$lib/server/season';
import { getField } from '$lib/server/fields';
import { harvestCsv, listHarvest } from '$lib/server/harvest';

export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const season = parseSeason(event.params.season);
	const field = await getField(access, event.params.fieldId);
	const csv = harvestCsv(await listHarvest(access, field.id, season));
	const name = `harvest-${field.name.replace(/[^A-Za-z0-9]+/g, '-').replace(/^-|-$/g, '').toLowerCase() || 'field'}-${season}.csv`;
	return new Response(csv, { headers: { 'content-type': 'text/csv; charset=utf-8', 'content-disposition': `attachment; filename="${name}"` } });
});
