import type { PageServerLoad } from './$types';
import { requireMember } from '$lib/server/access';
import { pageError } from '$lib/server/errors';
import { parseSeason } from '$lib/server/season';
import { seasonView } from '$lib/server/record-pages';

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	try {
		return await seasonView(access, event.params.fieldId, parseSeason(event.params.season));
	} catch (e) {
		pageError(e);
	}
};
