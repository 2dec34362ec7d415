import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { deleteRecord, getRecord, updateRecord } from '$lib/server/records';
import { recordPatchSchema } from '$lib/schemas/records';
import { parseSeason } from '$lib/server/season';
import { invalid } from '$lib/server/errors';

export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	return json(await getRecord(access, event.params.fieldId, parseSeason(event.params.season), event.params.recordId));
});

export const PATCH: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'logRecords');
	const season = parseSeason(event.params.season);
	const patch = await readJson(event, recordPatchSchema);
	const { record, warnings } = await updateRecord(access, event.params.fieldId, season, event.params.recordId, patch);
	return json({ ...record, warnings });
});

export const DELETE: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'logRecords');
	const season = parseSeason(event.params.season);
	const sent = event.url.searchParams.get('version');
	if (sent !== null && !/^\d+$/.test(sent)) throw invalid('"version" is a whole number.', { version: ['Send the version you saw.'] });
	return json(await deleteRecord(access, event.params.fieldId, season, event.params.recordId, sent === null ? undefined : Number(sent)));
});
