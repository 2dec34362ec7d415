import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { acreageReport } from '$lib/server/acreage';
import { seasonParam } from '$lib/server/exports';

export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const report = await acreageReport(access, seasonParam(event.url)!);
	return json(report, { headers: { 'cache-control': 'no-store' } });
});
