import type { PageServerLoad } from './$types';
import { requireMember } from '$lib/server/access';
import { isSeasonText } from '$lib/server/season';
import { farmNeeds } from '$lib/server/farm-needs';
import { comingSeason } from '$lib/farm/seasons';

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const raw = event.url.searchParams.get('season');
	let season = comingSeason(new Date(), access.farm.timeZone);
	let seasonProblem: string | null = null;
	if (raw !== null && raw !== '') {
		if (isSeasonText(raw)) season = Number(raw);
		else seasonProblem = `"${raw.slice(0, 24)}" is not a season (a year from 1900 to 2200); showing ${season}.`;
	}
	return { needs: await farmNeeds(access, season), seasonProblem };
};
