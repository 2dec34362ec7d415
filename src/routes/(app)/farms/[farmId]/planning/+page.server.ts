import { fail } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireMember } from '$lib/server/access';
import { isSeasonText } from '$lib/server/season';
import { planEveryMissingField, planningBoard } from '$lib/server/planning-board';
import { comingSeason } from '$lib/farm/seasons';

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const raw = event.url.searchParams.get('season');
	let season = comingSeason(new Date(), access.farm.timeZone);
	let seasonProblem: string | null = null;
	if (raw !== null && raw !== '') {
		if (isSeasonText(raw) && Number(raw) > 1900) season = Number(raw);
		else seasonProblem = `"${raw.slice(0, 24)}" is not a season to plan (a year from 1901 to 2200); showing ${season}.`;
	}
	return { board: await planningBoard(access, season), seasonProblem };
};

export const actions: Actions = {
	planAll: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'editPlans');
		const form = await event.request.formData();
		const raw = String(form.get('season') ?? '');
		if (!isSeasonText(raw) || Number(raw) <= 1900) {
			return fail(400, { message: `Choose a season to plan (a year from 1901 to 2200), not "${raw.slice(0, 24)}".` });
		}
		return { batch: await planEveryMissingField(access, Number(raw)) };
	}
};
