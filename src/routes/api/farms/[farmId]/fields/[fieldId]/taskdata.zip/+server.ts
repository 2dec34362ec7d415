import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { fileSafe, seasonParam, taskDataZip } from '$lib/server/exports';

// ?season= adds that season's A-B line; without it the file carries the boundary alone.
export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const season = seasonParam(event.url, false);
	const { field, bytes } = await taskDataZip(access, event.params.fieldId, season);
	return new Response(new Uint8Array(bytes), {
		headers: {
			'content-type': 'application/zip',
			'content-disposition': `attachment; filename="taskdata-${fileSafe(field.name)}${season ? `-${season}` : ''}.zip"`,
			'cache-control': 'no-store'
		}
	});
});
