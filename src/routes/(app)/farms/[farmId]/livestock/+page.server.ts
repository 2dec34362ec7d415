import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireMember } from '$lib/server/access';
import { farmToday, livestockBoard } from '$lib/server/livestock-board';
import { createGroup } from '$lib/server/livestock';
import { createMove, moveToNextStretch, LIVESTOCK_CAUTION } from '$lib/server/livestock-moves';
import { zodFields } from '$lib/server/api';
import { groupCreateSchema, moveSchema } from '$lib/livestock/schemas';
import { formNumber, formText, formValues, refusal } from './livestock-form.server';

const DATE = /^\d{4}-\d{2}-\d{2}$/;

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const p = event.url.searchParams;
	const today = farmToday(access);
	const askedDate = p.get('date') ?? '';
	const askedSeason = Number(p.get('season'));
	const season = Number.isInteger(askedSeason) && askedSeason >= 1900 && askedSeason <= 2200 ? askedSeason : DATE.test(askedDate) ? Number(askedDate.slice(0, 4)) : Number(today.slice(0, 4));
	// The chosen date stays inside the season.
	let date = DATE.test(askedDate) && !Number.isNaN(Date.parse(askedDate)) ? askedDate : today;
	if (Number(date.slice(0, 4)) !== season) date = Number(date.slice(0, 4)) > season ? `${season}-12-31` : `${season}-01-01`;
	const board = await livestockBoard(access, { season, fieldId: p.get('field'), date });
	return { board, caution: LIVESTOCK_CAUTION, moved: p.get('moved') };
};

function backTo(url: URL, changes: Record<string, string>) {
	const next = new URL(url);
	next.search = '';
	for (const key of ['field', 'season', 'date']) {
		const v = url.searchParams.get(key);
		if (v) next.searchParams.set(key, v);
	}
	for (const [k, v] of Object.entries(changes)) next.searchParams.set(k, v);
	return `${next.pathname}${next.search}`;
}

export const actions: Actions = {
	createGroup: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'editPlans');
		const form = await event.request.formData();
		const values = formValues(form);
		const parsed = groupCreateSchema.safeParse({ name: formText(form, 'name'), species: formText(form, 'species'), head: formNumber(form, 'head'), averageWeightLb: formNumber(form, 'averageWeightLb'), notes: formText(form, 'notes') });
		if (!parsed.success) return fail(400, { form: 'group', message: 'Some values need fixing; see the messages beside them.', code: 'invalid', errors: zodFields(parsed.error), values });
		let id: string;
		try {
			id = (await createGroup(access, parsed.data)).id;
		} catch (e) {
			return refusal(e, 'group', values);
		}
		redirect(303, `/farms/${access.farm.id}/livestock/${id}`);
	},

	move: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'logRecords');
		const form = await event.request.formData();
		const values = formValues(form);
		const parsed = moveSchema.safeParse({
			groupId: formText(form, 'groupId'),
			fieldId: formText(form, 'fieldId'),
			season: formNumber(form, 'season'),
			laneIndex: formNumber(form, 'laneIndex'),
			from: formText(form, 'from'),
			to: formText(form, 'to'),
			fromFt: formNumber(form, 'fromFt'),
			toFt: formNumber(form, 'toFt'),
			shelterId: formText(form, 'shelterId') || null,
			forageLbPerAcre: formNumber(form, 'forageLbPerAcre') ?? null,
			utilization: (() => {
				const pct = formNumber(form, 'utilizationPct');
				return pct === undefined ? null : pct / 100;
			})(),
			intakePct: formNumber(form, 'intakePct') ?? null,
			acknowledge: form.get('acknowledge') === 'on',
			notes: formText(form, 'notes')
		});
		if (!parsed.success) {
			const errors = zodFields(parsed.error);
			if (errors.utilization) errors.utilizationPct = errors.utilization.map(() => 'Utilization is a percent above 0 and up to 100.');
			return fail(400, { form: 'move', message: 'Some values need fixing; see the messages beside them.', code: 'invalid', errors, values });
		}
		let moved;
		try {
			moved = await createMove(access, parsed.data);
		} catch (e) {
			return refusal(e, 'move', values);
		}
		redirect(303, backTo(event.url, { field: moved.fieldId, season: String(moved.season), date: formText(form, 'from').slice(0, 10), moved: moved.id }));
	},

	next: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'logRecords');
		const form = await event.request.formData();
		const values = formValues(form);
		let moved;
		try {
			moved = await moveToNextStretch(access, formText(form, 'groupId'), form.get('acknowledge') === 'on');
		} catch (e) {
			return refusal(e, `next:${formText(form, 'groupId')}`, values);
		}
		const day = new Intl.DateTimeFormat('en-CA', { timeZone: access.farm.timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(new Date(moved.from));
		redirect(303, backTo(event.url, { field: moved.fieldId, season: String(moved.season), date: day, moved: moved.id }));
	}
};
