import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/api';
import { requireUser } from '$lib/server/access';
import { AppError } from '$lib/server/errors';
import { layoutPreviewSchema } from '$lib/schemas/plan';
import { GeometryError, type LayoutInput } from '$lib/geometry/index';
import { refuseLayoutError } from '$lib/server/plans';
import { geometryPool } from '$lib/server/geometry-pool';
import { takeRequest } from '$lib/server/rate-limit';

// Stateless: lays out what it is sent and stores nothing, so any signed-in user may call it, within
// a per-user rate, off the request thread.
export const POST: RequestHandler = api(async (event) => {
	const user = requireUser(event);
	const rate = await takeRequest('layout-preview', user.id);
	if (!rate.allowed) throw new AppError(429, rate.message!, 'too_many_requests', undefined, { 'Retry-After': String(rate.retryAfterSeconds) });
	const input = await readJson(event, layoutPreviewSchema);
	try {
		return json(await geometryPool().run({ kind: 'layout', input: input as LayoutInput }));
	} catch (e) {
		if (e instanceof GeometryError) throw refuseLayoutError(e);
		throw e;
	}
});
