import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { seasonRestrictions } from '$lib/server/restrictions';
import { getField } from '$lib/server/fields';
import { invalid, notFound } from '$lib/server/errors';
import { parseSeason } from '$lib/server/season';

const ISO_WITH_ZONE = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d+)?)?(Z|[+-]\d{2}:?\d{2})$/;

export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const season = parseSeason(event.params.season);
	const sent = event.url.searchParams.get('at');
	const at = sent === null ? new Date() : new Date(sent);
	if (sent !== null && (!ISO_WITH_ZONE.test(sent) || Number.isNaN(at.getTime()))) {
		throw invalid('"at" must be a date and time in ISO 8601 with an offset, e.g. 2026-06-02T14:30:00-05:00.', { at: ['Use ISO 8601 with an offset.'] });
	}
	await getField(access, event.params.fieldId);
	const lanes = await seasonRestrictions(access, event.params.fieldId, season, at);
	if (!lanes) throw notFound(`adopted plan for ${season}`);
	return json({ at: at.toISOString(), timeZone: access.farm.timeZone, lanes });
});
