import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireMember } from '$lib/server/access';
import { pageError } from '$lib/server/errors';
import { getField } from '$lib/server/fields';
import { parseSeason } from '$lib/server/season';
import { createRecord } from '$lib/server/records';
import { mapLanes, productOptions, seasonPlanOrNull, seedingGroups } from '$lib/server/record-pages';
import { formFailure, isoToLocal, readRecordForm } from '$lib/server/record-form';

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'logRecords');
	try {
		const season = parseSeason(event.params.season);
		const field = await getField(access, event.params.fieldId);
		const plan = await seasonPlanOrNull(access, field.id, season);
		const now = isoToLocal(new Date(), access.farm.timeZone);
		return {
			field: { id: field.id, name: field.name },
			season,
			hasPlan: Boolean(plan),
			lanes: mapLanes(plan),
			seeding: seedingGroups(plan),
			products: await productOptions(access),
			defaults: { startedAt: now, endedAt: now }
		};
	} catch (e) {
		pageError(e);
	}
};

export const actions: Actions = {
	default: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'logRecords');
		const season = parseSeason(event.params.season);
		const field = await getField(access, event.params.fieldId).catch(pageError);
		const plan = await seasonPlanOrNull(access, field.id, season);
		const form = await event.request.formData();
		const read = readRecordForm(form, plan?.lanes.length ?? 0, access.farm.timeZone);
		if ('failure' in read) return fail(400, read.failure);
		let id: string;
		try {
			id = (await createRecord(access, field.id, season, read.input)).record.id;
		} catch (e) {
			return formFailure(e, Object.fromEntries([...form.entries()].filter(([, v]) => typeof v === 'string')) as Record<string, string>);
		}
		redirect(303, `/farms/${access.farm.id}/fields/${field.id}/seasons/${season}/records/${id}?saved=1`);
	}
};
