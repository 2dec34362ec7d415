import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireMember } from '$lib/server/access';
import { AppError, pageError } from '$lib/server/errors';
import { parseSeason } from '$lib/server/season';
import { getField } from '$lib/server/fields';
import { createHarvestEntry, deleteHarvestEntry, entryJson, listHarvest } from '$lib/server/harvest';
import { harvestAnalysis } from '$lib/server/harvest-analysis';
import { GRAIN_CROPS } from '$lib/harvest/entry';
import { parseLaneList } from '$lib/harvest/lane-list';

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const season = parseSeason(event.params.season);
	const field = await getField(access, event.params.fieldId).catch(pageError);
	// Sole-crop yields typed in for crops without a check strip: ?sole.corn=210
	const sole: Record<string, number> = {};
	for (const crop of GRAIN_CROPS) {
		const v = Number(event.url.searchParams.get(`sole.${crop}`));
		if (Number.isFinite(v) && v > 0 && v < 1000) sole[crop] = v;
	}
	const [entries, analysis] = await Promise.all([listHarvest(access, field.id, season), harvestAnalysis(access, field.id, season, sole)]).catch(pageError);
	return {
		field: { id: field.id, name: field.name },
		season,
		entries: entries.map(entryJson),
		analysis,
		sole,
		saved: event.url.searchParams.get('saved') === '1',
		deleted: event.url.searchParams.get('deleted') === '1'
	};
};

const num = (v: FormDataEntryValue | null) => {
	const s = String(v ?? '').trim().replace(/,/g, '');
	return s === '' ? null : Number(s);
};

export const actions: Actions = {
	log: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'logRecords');
		const season = parseSeason(event.params.season);
		const form = await event.request.formData();
		const values = Object.fromEntries([...form.entries()].map(([k, v]) => [k, String(v)]));
		const lanes = parseLaneList(values.lanes ?? '');
		if ('error' in lanes) return fail(400, { values, message: lanes.error, fields: { laneIndexes: [lanes.error] } as Record<string, string[]> });
		try {
			await createHarvestEntry(access, event.params.fieldId, season, {
				laneIndexes: lanes.indexes,
				crop: values.crop ?? '',
				wetWeightLb: num(form.get('wetWeightLb')) ?? NaN,
				moisturePct: num(form.get('moisturePct')) ?? NaN,
				lengthFt: num(form.get('lengthFt')),
				rows: num(form.get('rows')),
				rowSpacingIn: num(form.get('rowSpacingIn')),
				rowPosition: (values.rowPosition || 'all') as 'all',
				harvestedOn: values.harvestedOn || null,
				notes: values.notes || null
			});
		} catch (e) {
			if (e instanceof AppError && e.status === 400) return fail(400, { values, message: e.message, fields: e.fields ?? {} });
			if (e && typeof e === 'object' && 'issues' in e) {
				const fields: Record<string, string[]> = {};
				for (const i of (e as { issues: { path: (string | number)[]; message: string }[] }).issues) (fields[String(i.path[0] ?? '_')] ??= []).push(i.message);
				return fail(400, { values, message: 'Some values are missing or not valid.', fields });
			}
			return pageError(e);
		}
		redirect(303, `${event.url.pathname}?saved=1#entries`);
	},
	delete: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'logRecords');
		const season = parseSeason(event.params.season);
		const form = await event.request.formData();
		try {
			await deleteHarvestEntry(access, event.params.fieldId, season, String(form.get('id') ?? ''), Number(form.get('version')));
		} catch (e) {
			if (e instanceof AppError && (e.status === 409 || e.status === 404)) return fail(e.status, { message: e.message, fields: {} as Record<string, string[]>, values: {} as Record<string, string> });
			return pageError(e);
		}
		redirect(303, `${event.url.pathname}?deleted=1#entries`);
	}
};
