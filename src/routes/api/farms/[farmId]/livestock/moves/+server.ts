import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/api';
import { requireMember, isUuid } from '$lib/server/access';
import { invalid } from '$lib/server/errors';
import { createMove, listMoves } from '$lib/server/livestock-moves';
import { moveSchema } from '$lib/livestock/schemas';

/** Moves of the farm, optionally of one season, field or group (?season=&fieldId=&groupId=). */
export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const p = event.url.searchParams;
	const season = p.get('season');
	if (season !== null && !/^\d{4}$/.test(season)) throw invalid('season must be a year, e.g. 2026.', { season: ['season must be a year, e.g. 2026.'] });
	for (const key of ['fieldId', 'groupId']) {
		const v = p.get(key);
		if (v !== null && !isUuid(v)) throw invalid(`${key} must be an id.`, { [key]: [`${key} must be an id.`] });
	}
	return json(await listMoves(access, { season: season ? Number(season) : undefined, fieldId: p.get('fieldId') ?? undefined, groupId: p.get('groupId') ?? undefined }));
});

export const POST: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'logRecords');
	const input = await readJson(event, moveSchema);
	return json(await createMove(access, input), { status: 201 });
});
