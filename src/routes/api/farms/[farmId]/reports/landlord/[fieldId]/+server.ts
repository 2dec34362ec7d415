import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { seasonParam } from '$lib/server/exports';
import { landlordSummary } from '$lib/server/landlord';

export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	return json(await landlordSummary(access, event.params.fieldId, seasonParam(event.url)!), { headers: { 'cache-control': 'no-store' } });
});
