import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { getGroup, listEvents, logEvent } from '$lib/server/livestock';
import { eventSchema } from '$lib/livestock/schemas';

export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	return json(await listEvents(access, event.params.groupId));
});

/** Births, purchases, sales, deaths and losses; the answer carries the group's new head count. */
export const POST: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'logRecords');
	await getGroup(access, event.params.groupId);
	const { event: logged, group } = await logEvent(access, event.params.groupId, await readJson(event, eventSchema));
	return json({ ...logged, group }, { status: 201 });
});
