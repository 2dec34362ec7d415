import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { parseSeason } from '$lib/server/season';
import { listYieldImports, readYieldUpload, startYieldImport } from '$lib/server/yield-import';

export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	return json(await listYieldImports(access, event.params.fieldId, parseSeason(event.params.season)));
});

// multipart: file, source, mapping? (JSON). 202: stored, and queued unless its columns still need naming.
export const POST: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'logRecords');
	const season = parseSeason(event.params.season);
	const upload = await readYieldUpload(event.request);
	return json(await startYieldImport(access, event.params.fieldId, season, upload), { status: 202 });
});
