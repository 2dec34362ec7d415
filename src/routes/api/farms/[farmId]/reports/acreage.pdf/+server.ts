import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { acreageReport } from '$lib/server/acreage';
import { renderAcreagePdf } from '$lib/server/acreage-pdf';
import { fileSafe, seasonParam } from '$lib/server/exports';

export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const report = await acreageReport(access, seasonParam(event.url)!);
	const pdf = await renderAcreagePdf(report, access.farm.name, access.farm.timeZone);
	return new Response(new Uint8Array(pdf), {
		headers: {
			'content-type': 'application/pdf',
			'content-disposition': `inline; filename="crop-acreage-${fileSafe(access.farm.name)}-${report.season}.pdf"`,
			'cache-control': 'no-store'
		}
	});
});
