import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { fileSafe, seasonParam } from '$lib/server/exports';
import { landlordSummary } from '$lib/server/landlord';
import { renderLandlordPdf } from '$lib/server/landlord-pdf';

export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const summary = await landlordSummary(access, event.params.fieldId, seasonParam(event.url)!);
	const pdf = await renderLandlordPdf(summary, access.farm.name, access.farm.timeZone);
	return new Response(new Uint8Array(pdf), {
		headers: {
			'content-type': 'application/pdf',
			'content-disposition': `inline; filename="season-summary-${fileSafe(summary.field.name)}-${summary.season}.pdf"`,
			'cache-control': 'no-store'
		}
	});
});
