import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { isUuid, requireField, requireMember } from '$lib/server/access';
import { invalid } from '$lib/server/errors';
import { parseSeason } from '$lib/server/season';
import { laneRecords } from '$lib/server/farm-season';

/** The last records of one lane: ?fieldId=…&laneIndex=… (0-based). */
export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const season = parseSeason(event.params.season);
	const fieldId = event.url.searchParams.get('fieldId') ?? '';
	const laneText = event.url.searchParams.get('laneIndex') ?? '';
	const fields: Record<string, string[]> = {};
	if (!isUuid(fieldId)) fields.fieldId = ['Give the field id (a UUID).'];
	if (!/^\d{1,5}$/.test(laneText)) fields.laneIndex = ['Give the lane index, a whole number from 0.'];
	if (Object.keys(fields).length) throw invalid('Say which lane: ?fieldId=…&laneIndex=…', fields);
	await requireField(access, fieldId);
	const records = await laneRecords(access, fieldId, season, Number(laneText));
	return json({ records }, { headers: { 'cache-control': 'private, no-store' } });
});
