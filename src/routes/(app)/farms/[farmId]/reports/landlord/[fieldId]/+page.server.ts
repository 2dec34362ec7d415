import type { PageServerLoad } from './$types';
import { requireMember } from '$lib/server/access';
import { pageError } from '$lib/server/errors';
import { landlordSummary } from '$lib/server/landlord';
import { reportSeasons } from '$lib/server/report-seasons';

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const { season, seasons } = await reportSeasons(access, event.url.searchParams.get('season'));
	const summary = await landlordSummary(access, event.params.fieldId, season).catch(pageError);
	return { season, seasons, summary };
};
