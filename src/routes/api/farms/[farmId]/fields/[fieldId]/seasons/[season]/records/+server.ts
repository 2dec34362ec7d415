import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { createRecord, listRecords } from '$lib/server/records';
import { recordCreateSchema } from '$lib/schemas/records';
import { parseSeason } from '$lib/server/season';
import { invalid } from '$lib/server/errors';

export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const season = parseSeason(event.params.season);
	const p = event.url.searchParams;
	const lane = p.get('lane');
	if (lane !== null && !/^\d+$/.test(lane)) throw invalid('"lane" is a lane index (0, 1, 2 …).', { lane: ['Use a lane index (0-based).'] });
	const records = await listRecords(access, event.params.fieldId, season, {
		type: p.get('type'),
		laneIndex: lane === null ? null : Number(lane),
		productId: p.get('productId'),
		includeDeleted: p.get('deleted') === '1' && access.can('editPlans')
	});
	return json({ records });
});

export const POST: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'logRecords');
	const season = parseSeason(event.params.season);
	const input = await readJson(event, recordCreateSchema);
	const { record, warnings } = await createRecord(access, event.params.fieldId, season, input);
	return json({ ...record, warnings }, { status: 201 });
});
