import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { getField } from '$lib/server/fields';
import { listRecords } from '$lib/server/records';
import { recordsCsv } from '$lib/server/record-csv';
import { parseSeason } from '$lib/server/season';

export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const season = parseSeason(event.params.season);
	const field = await getField(access, event.params.fieldId);
	const records = await listRecords(access, field.id, season);
	const name = `${field.name.replace(/[^A-Za-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'field'}-${season}-records.csv`;
	return new Response(recordsCsv(records, access.farm.timeZone), {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="${name}"`,
			'cache-control': 'private, no-store'
		}
	});
});
