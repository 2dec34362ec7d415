import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireMember } from '$lib/server/access';
import { pageError } from '$lib/server/errors';
import { getField } from '$lib/server/fields';
import { parseSeason } from '$lib/server/season';
import { createRecord, getRecord } from '$lib/server/records';
import { productOptions, seasonPlanOrNull } from '$lib/server/record-pages';
import { formFailure, formValues } from '$lib/server/record-form';
import { parseLaneList } from '$lib/plans/lane-selection';
import { recordCreateSchema } from '$lib/schemas/records';
import { zodFields } from '$lib/server/api';
import { isUuid } from '$lib/server/access';

// Quick entry: the few taps of a pass just finished, from a phone in the field.
const JOBS = {
	'side-dress': { type: 'fertilizer', details: { placement: 'side-dress' } },
	spraying: { type: 'spraying', details: {} },
	fertilizer: { type: 'fertilizer', details: {} },
	mowing: { type: 'mowing', details: {} },
	tillage: { type: 'tillage', details: {} }
} as const;

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'logRecords');
	try {
		const season = parseSeason(event.params.season);
		const field = await getField(access, event.params.fieldId);
		const plan = await seasonPlanOrNull(access, field.id, season);
		const savedId = event.url.searchParams.get('saved');
		const saved = isUuid(savedId) ? await getRecord(access, field.id, season, savedId).catch(() => null) : null;
		const crops = plan ? [...new Set(plan.lanes.filter((l) => l.kind === 'crop').map((l) => l.crop))] : [];
		return {
			field: { id: field.id, name: field.name },
			season,
			laneCount: plan?.lanes.length ?? 0,
			crops: crops.map((crop) => ({ crop, lanes: plan!.lanes.filter((l) => l.crop === crop).length, acres: plan!.lanes.filter((l) => l.crop === crop).reduce((s, l) => s + l.acres, 0) })),
			products: await productOptions(access),
			saved: saved && { id: saved.id, type: saved.type, laneIndexes: saved.laneIndexes, acres: saved.acres, products: saved.products.map((p) => ({ name: p.productName, total: p.total, totalUnit: p.totalUnit, shown: p.shownTotal })) }
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
		const values = formValues(await event.request.formData());
		const fields: Record<string, string[]> = {};
		const job = JOBS[values.job as keyof typeof JOBS];
		if (!job) fields.job = ['Pick what was done.'];
		let laneIndexes: number[] = [];
		if (values.lanes === 'list') {
			const parsed = parseLaneList(values.laneList ?? '', plan?.lanes.length ?? 0);
			if ('error' in parsed) fields.laneIndexes = [parsed.error];
			else laneIndexes = parsed.indexes;
		} else {
			laneIndexes = (plan?.lanes ?? []).filter((l) => l.crop === values.lanes).map((l) => l.index);
			if (!laneIndexes.length) fields.laneIndexes = ['Choose where: all lanes of one crop, or a list of lane numbers.'];
		}
		const minutesAgo = Number(values.finished ?? 0);
		const tookMinutes = Number(values.took ?? 60);
		const ended = new Date(Date.now() - (Number.isFinite(minutesAgo) ? minutesAgo : 0) * 60_000);
		const started = new Date(ended.getTime() - (Number.isFinite(tookMinutes) ? tookMinutes : 60) * 60_000);
		const products = values.productId ? [{ productId: values.productId, rate: values.rate?.trim() ? Number(values.rate) : Number.NaN, rateUnit: values.rateUnit ?? '' }] : [];
		const parsed = recordCreateSchema.safeParse({
			type: job?.type ?? 'other',
			startedAt: started.toISOString(),
			endedAt: ended.toISOString(),
			laneIndexes: laneIndexes.length ? laneIndexes : [0],
			products,
			applicator: values.applicator?.trim() || null,
			applicatorCertNumber: values.applicatorCertNumber?.trim() || null,
			details: job?.details ?? {}
		});
		if (!parsed.success) Object.assign(fields, zodFields(parsed.error));
		if (Object.keys(fields).length || !parsed.success) return fail(400, { message: 'Some choices are missing; see the messages beside them.', fields, values });
		let id: string;
		try {
			id = (await createRecord(access, field.id, season, parsed.data)).record.id;
		} catch (e) {
			return formFailure(e, values);
		}
		redirect(303, `/farms/${access.farm.id}/fields/${field.id}/seasons/${season}/quick?saved=${id}`);
	}
};
