import type { PageServerLoad } from './$types';
import { requireMember } from '$lib/server/access';
import { acreageReport } from '$lib/server/acreage';
import { listFields } from '$lib/server/fields';
import { reportSeasons } from '$lib/server/report-seasons';

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const { season, seasons } = await reportSeasons(access, event.url.searchParams.get('season'));
	const [report, fields] = await Promise.all([acreageReport(access, season), listFields(access)]);
	return { season, seasons, report, fields: fields.map((f) => ({ id: f.id, name: f.name, landlord: f.landlord })) };
};
