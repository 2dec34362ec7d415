import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { parseSeason } from '$lib/server/season';
import { getYieldImport } from '$lib/server/yield-import';

// Polled by the import page for its progress bar.
export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const found = await getYieldImport(access, event.params.fieldId, parseSeason(event.params.season), event.params.importId);
	return json(found, { headers: { 'cache-control': 'no-store' } });
});
