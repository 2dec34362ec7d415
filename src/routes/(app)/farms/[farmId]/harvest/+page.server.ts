import type { PageServerLoad } from './$types';
import { requireMember } from '$lib/server/access';
import { listFields } from '$lib/server/fields';
import { farmHarvestIndex } from '$lib/server/harvest-analysis';

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const [rows, fields] = await Promise.all([farmHarvestIndex(access), listFields(access)]);
	const thisYear = new Date().getFullYear();
	return { rows, fields: fields.map((f) => ({ id: f.id, name: f.name })), seasons: [...new Set([thisYear, ...rows.map((r) => r.season)])].sort((a, b) => b - a) };
};
