import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { acreageReport } from '$lib/server/acreage';
import { fileSafe, seasonParam } from '$lib/server/exports';
import { acreageCsv } from '$lib/reports/acreage';

export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const report = await acreageReport(access, seasonParam(event.url)!);
	return new Response(acreageCsv(report), {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="crop-acreage-${fileSafe(access.farm.name)}-${report.season}.csv"`,
			'cache-control': 'no-store'
		}
	});
});
