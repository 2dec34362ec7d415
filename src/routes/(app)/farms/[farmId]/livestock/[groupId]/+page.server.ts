import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireMember } from '$lib/server/access';
import { pageError } from '$lib/server/errors';
import { getGroup, listEvents, logEvent } from '$lib/server/livestock';
import { listMoves, LIVESTOCK_CAUTION } from '$lib/server/livestock-moves';
import { farmToday } from '$lib/server/livestock-board';
import { zodFields } from '$lib/server/api';
import { eventSchema } from '$lib/livestock/schemas';
import { formNumber, formText, formValues, refusal } from '../livestock-form.server';

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const group = await getGroup(access, event.params.groupId).catch(pageError);
	const [events, moves] = await Promise.all([listEvents(access, group.id), listMoves(access, { groupId: group.id })]);
	return { group, events, moves, caution: LIVESTOCK_CAUTION, today: farmToday(access), logged: event.url.searchParams.get('logged') };
};

export const actions: Actions = {
	event: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'logRecords');
		const form = await event.request.formData();
		const values = formValues(form);
		const parsed = eventSchema.safeParse({ kind: formText(form, 'kind'), head: formNumber(form, 'head'), cause: formText(form, 'cause'), occurredAt: formText(form, 'occurredAt'), notes: formText(form, 'notes') });
		if (!parsed.success) return fail(400, { form: 'event', message: 'Some values need fixing; see the messages beside them.', code: 'invalid', errors: zodFields(parsed.error), values });
		let id: string;
		try {
			id = (await logEvent(access, event.params.groupId, parsed.data)).event.id;
		} catch (e) {
			return refusal(e, 'event', values);
		}
		redirect(303, `/farms/${access.farm.id}/livestock/${event.params.groupId}?logged=${id}`);
	}
};
