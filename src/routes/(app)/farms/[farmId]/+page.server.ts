import type { PageServerLoad } from './$types';
import { requireMember } from '$lib/server/access';
import { listMembers } from '$lib/server/team';
import { isSeasonText } from '$lib/server/season';
import { farmSeason, fieldOutlines, plannedSeasons, seasonSummary } from '$lib/server/farm-season';
import { defaultSeason, yearInZone } from '$lib/farm/seasons';

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const seasons = await plannedSeasons(access);
	const raw = event.url.searchParams.get('season');
	let season = defaultSeason(seasons, yearInZone(new Date(), access.farm.timeZone));
	let seasonProblem: string | null = null;
	if (raw !== null && raw !== '') {
		if (isSeasonText(raw)) season = Number(raw);
		else seasonProblem = `"${raw.slice(0, 24)}" is not a season this farm can plan (a year from 1900 to 2200); showing ${season}.`;
	}
	const [outlines, seasonData, summary, members] = await Promise.all([
		fieldOutlines(access),
		farmSeason(access, season),
		seasonSummary(access, season),
		listMembers(access.farm.id)
	]);
	return { season, seasons, outlines, seasonData, summary, seasonProblem, memberCount: members.length };
};
