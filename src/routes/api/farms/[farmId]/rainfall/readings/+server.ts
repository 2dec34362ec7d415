import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/api';
import { isUuid, requireMember } from '$lib/server/access';
import { invalid } from '$lib/server/errors';
import { createReading, listReadings } from '$lib/server/rainfall';
import { isSeasonText } from '$lib/server/season';
import { readingSchema } from '$lib/schemas/rainfall';

/** ?season=YYYY (the calendar year) and optionally &gaugeId= → {readings}, oldest first. */
export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const season = event.url.searchParams.get('season') ?? '';
	if (!isSeasonText(season)) throw invalid('Give the season as a four-digit year, e.g. ?season=2026.', { season: ['A four-digit year.'] });
	const gaugeId = event.url.searchParams.get('gaugeId');
	if (gaugeId !== null && !isUuid(gaugeId)) throw invalid('gaugeId must be the id of one of this farm\'s rain gauges.', { gaugeId: ['Not a gauge id.'] });
	return json({ readings: await listReadings(access, Number(season), gaugeId) });
});

/** {gaugeId, date: YYYY-MM-DD (or readAt: ISO instant, read on the farm's clock), inches, notes?} → 201 with any warnings. */
export const POST: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'logRecords');
	const input = await readJson(event, readingSchema);
	return json(await createReading(access, input), { status: 201 });
});
