import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import type { ZodType } from 'zod';
import { zodFields } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { AppError, pageError } from '$lib/server/errors';
import { listFields } from '$lib/server/fields';
import { createGauge, createReading, deleteGauge, deleteReading, rainfallSeason, updateReading } from '$lib/server/rainfall';
import { isSeasonText } from '$lib/server/season';
import { calendarDayIn } from '$lib/rainfall/totals';
import { gaugeSchema, readingPatchSchema, readingSchema } from '$lib/schemas/rainfall';

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const today = calendarDayIn(new Date(), access.farm.timeZone);
	const asked = event.url.searchParams.get('season') ?? '';
	const season = isSeasonText(asked) ? Number(asked) : Number(today.slice(0, 4));
	const [summary, fields] = await Promise.all([rainfallSeason(access, season).catch(pageError), listFields(access)]);
	return {
		season,
		today,
		summary,
		fields: fields.map((f) => ({ id: f.id, name: f.name, boundary: f.boundary }))
	};
};

function formValues(form: FormData): Record<string, string> {
	const out: Record<string, string> = {};
	for (const [k, v] of form.entries()) if (typeof v === 'string') out[k] = v;
	return out;
}

const num = (v: FormDataEntryValue | null) => (typeof v === 'string' && v.trim() !== '' && !Number.isNaN(Number(v)) ? Number(v) : v === null || v === '' ? undefined : v);
const str = (v: FormDataEntryValue | null) => (typeof v === 'string' && v.trim() !== '' ? v : undefined);

/** Runs one form action: validation and domain refusals come back beside the form, tagged with which form sent them. */
async function act<T>(which: string, form: FormData, schema: ZodType<T>, raw: unknown, run: (input: T) => Promise<unknown>) {
	try {
		const parsed = schema.safeParse(raw);
		if (!parsed.success) throw new AppError(400, 'Some values are missing or not valid; see the marked fields.', 'invalid', zodFields(parsed.error));
		await run(parsed.data);
	} catch (e) {
		if (e instanceof AppError && e.status < 500 && e.status !== 404) return fail(e.status, { which, message: e.message, fields: e.fields ?? {}, values: formValues(form) });
		return pageError(e);
	}
	return null;
}

export const actions: Actions = {
	addReading: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'logRecords');
		const form = await event.request.formData();
		const raw = { gaugeId: str(form.get('gaugeId')) ?? '', date: str(form.get('date')), inches: num(form.get('inches')), notes: str(form.get('notes')) };
		let warnings: string[] = [];
		const refused = await act('reading', form, readingSchema, raw, async (input) => {
			warnings = (await createReading(access, input)).warnings;
		});
		if (refused) return refused;
		if (warnings.length) return { which: 'reading', saved: true, warnings };
		redirect(303, `?season=${String(raw.date ?? '').slice(0, 4)}&saved=reading`);
	},
	correctReading: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'logRecords');
		const form = await event.request.formData();
		const readingId = String(form.get('readingId') ?? '');
		const raw = { version: num(form.get('version')), inches: num(form.get('inches')) };
		const refused = await act(`correct-${readingId}`, form, readingPatchSchema, raw, (input) => updateReading(access, readingId, input));
		if (refused) return refused;
		redirect(303, `?season=${event.url.searchParams.get('season') ?? ''}&saved=correction`);
	},
	deleteReading: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'logRecords');
		const form = await event.request.formData();
		await deleteReading(access, String(form.get('readingId') ?? '')).catch(pageError);
		redirect(303, `?season=${event.url.searchParams.get('season') ?? ''}&saved=deleted`);
	},
	addGauge: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'editPlans');
		const form = await event.request.formData();
		const lng = num(form.get('lng'));
		const lat = num(form.get('lat'));
		const raw = { name: str(form.get('name')) ?? '', location: lng === undefined && lat === undefined ? undefined : { lng, lat }, fieldId: str(form.get('fieldId')) ?? null, notes: str(form.get('notes')) };
		const refused = await act('gauge', form, gaugeSchema, raw, (input) => createGauge(access, input));
		if (refused) return refused;
		redirect(303, `?season=${event.url.searchParams.get('season') ?? ''}&saved=gauge`);
	},
	deleteGauge: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'editPlans');
		const form = await event.request.formData();
		await deleteGauge(access, String(form.get('gaugeId') ?? '')).catch(pageError);
		redirect(303, `?season=${event.url.searchParams.get('season') ?? ''}&saved=gauge-deleted`);
	}
};
