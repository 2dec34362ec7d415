import type { FarmAccess } from './access';
import { loadSheet } from './sheet';
import { renderSheetPdf } from './sheet-pdf';
import { listMembers } from './team';
import { sendMail } from './mail';
import { invalid } from './errors';
import { recordAudit } from './audit';
import { db } from './db';

/** Sends the sheet PDF to the chosen members of the farm (ids not in the farm are refused). */
export async function emailSheet(access: FarmAccess, fieldId: string, season: number, userIds: string[], opts: { planterId?: string | null; variant?: string }) {
	if (userIds.length === 0) throw invalid('Choose at least one person to send the sheet to.');
	const members = await listMembers(access.farm.id);
	const chosen = members.filter((m) => userIds.includes(m.userId) && m.role !== 'viewer');
	if (chosen.length !== userIds.length) throw invalid('Some recipients are not members of this farm who work the fields.');
	const sheet = await loadSheet(access, fieldId, season, opts);
	const pdf = await renderSheetPdf(sheet, { timeZone: access.farm.timeZone });
	const stops = sheet.checks.filter((c) => c.severity === 'stop').length;
	const filename = `seeding-sheet-${sheet.fieldName.replace(/[^A-Za-z0-9]+/g, '-')}-${season}.pdf`;
	const queued: string[] = [];
	for (const m of chosen) {
		const outcome = await sendMail({
			to: m.email,
			subject: `Seeding sheet: ${sheet.fieldName} ${season}`,
			text: `Hello ${m.name},\n\n${access.user.name} sent the seeding sheet for ${sheet.fieldName}, ${season} (${sheet.lanes.length} lanes, ${sheet.plantedAcres.toFixed(2)} ac planted).\n${stops ? `It lists ${stops} STOP problem${stops === 1 ? '' : 's'} to fix before planting.\n` : ''}\nThe PDF is attached. Check the row units against it before the first pass.\n`,
			attachments: [{ filename, content: pdf, contentType: 'application/pdf' }]
		});
		if (!outcome.sent) queued.push(m.email);
	}
	await recordAudit(db(), { farmId: access.farm.id, userId: access.user.id, entity: 'sheet', entityId: fieldId, action: 'email', after: { season, to: chosen.map((m) => m.email) } });
	return { to: chosen.map((m) => m.email), queued };
}
