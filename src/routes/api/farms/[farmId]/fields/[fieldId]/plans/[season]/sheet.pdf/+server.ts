import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { loadSheet } from '$lib/server/sheet';
import { renderSheetPdf } from '$lib/server/sheet-pdf';
import { parseSeason } from '$lib/server/season';
import { recordAudit } from '$lib/server/audit';
import { db } from '$lib/server/db';
import { wantsAppendix } from '$lib/sheet/condensed';

export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const sheet = await loadSheet(access, event.params.fieldId, parseSeason(event.params.season), {
		planterId: event.url.searchParams.get('planter'),
		variant: event.url.searchParams.get('variant') ?? undefined
	});
	// ?appendix=1 adds the full lists (every finding, lane and pass) after the two-sided sheet.
	const pdf = await renderSheetPdf(sheet, { timeZone: access.farm.timeZone, appendix: wantsAppendix(event.url) });
	// The planning board shows a sheet as printed once someone who works the field has taken its PDF.
	if (access.can('logRecords')) {
		await recordAudit(db(), { farmId: access.farm.id, userId: access.user.id, entity: 'sheet', entityId: event.params.fieldId, action: 'print', after: { season: sheet.season } });
	}
	const filename = `seeding-sheet-${sheet.fieldName.replace(/[^A-Za-z0-9]+/g, '-')}-${sheet.season}.pdf`;
	return new Response(new Uint8Array(pdf), {
		headers: { 'content-type': 'application/pdf', 'content-disposition': `inline; filename="${filename}"`, 'cache-control': 'no-store' }
	});
});
