import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { readUploadedShapes } from '$lib/server/field-upload';

// Answers with the shapes found; stores nothing. The page lets the user pick and name them.
export const POST: RequestHandler = api(async (event) => {
	await requireMember(event, event.params.farmId, 'editPlans');
	const result = await readUploadedShapes(event.request);
	return json({ ...result.shapes, format: result.format, warnings: result.warnings });
});
