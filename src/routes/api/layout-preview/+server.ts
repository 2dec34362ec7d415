import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/api';
import { requireUser } from '$lib/server/access';
import { layoutPreviewSchema } from '$lib/schemas/plan';
import { GeometryError, layoutStrips, type LayoutInput } from '$lib/geometry/index';
import { refuseLayoutError } from '$lib/server/plans';

// Stateless: lays out what it is sent and stores nothing, so any signed-in user may call it.
export const POST: RequestHandler = api(async (event) => {
	requireUser(event);
	const input = (await readJson(event, layoutPreviewSchema)) as LayoutInput;
	try {
		return json(layoutStrips(input));
	} catch (e) {
		if (e instanceof GeometryError) throw refuseLayoutError(e);
		throw e;
	}
});
