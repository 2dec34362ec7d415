import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad, RequestEvent } from './$types';
import { requireMember } from '$lib/server/access';
import { AppError, pageError } from '$lib/server/errors';
import { getField } from '$lib/server/fields';
import { parseSeason } from '$lib/server/season';
import { deleteRecord, getRecord, restoreRecord, updateRecord } from '$lib/server/records';
import { formValues, isoToLocal, localToIso } from '$lib/server/record-form';
import { recordPatchSchema } from '$lib/schemas/records';
import { zodFields } from '$lib/server/api';
import { rateWarning } from '$lib/records/amounts';

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	try {
		const season = parseSeason(event.params.season);
		const field = await getField(access, event.params.fieldId);
		const record = await getRecord(access, field.id, season, event.params.recordId);
		return {
			field: { id: field.id, name: field.name },
			season,
			record: { ...record, lanes: record.lanes.map(({ geometry: _g, ...l }) => l) },
			warnings: record.products.map((p) => rateWarning(p.rate, p.rateUnit)).filter((w): w is string => w !== null),
			local: { startedAt: isoToLocal(record.startedAt, access.farm.timeZone), endedAt: isoToLocal(record.endedAt, access.farm.timeZone) },
			saved: event.url.searchParams.get('saved') === '1'
		};
	} catch (e) {
		pageError(e);
	}
};

async function target(event: RequestEvent, capability: 'logRecords' | 'editPlans') {
	const access = await requireMember(event, event.params.farmId, capability);
	const season = parseSeason(event.params.season);
	return { access, season, fieldId: event.params.fieldId, recordId: event.params.recordId };
}

const refused = (e: unknown, values: Record<string, string> = {}) => {
	if (e instanceof AppError && e.status < 500) return fail(e.status, { message: e.message, fields: e.fields ?? {}, values });
	throw e;
};

export const actions: Actions = {
	save: async (event) => {
		const { access, season, fieldId, recordId } = await target(event, 'logRecords');
		const form = await event.request.formData();
		const values = formValues(form);
		const text = (k: string) => (values[k]?.trim() ? values[k].trim() : null);
		const num = (k: string) => (values[k]?.trim() ? Number(values[k]) : null);
		const parsed = recordPatchSchema.safeParse({
			version: Number(values.version),
			startedAt: localToIso(values.startedAt ?? '', access.farm.timeZone) ?? values.startedAt,
			endedAt: localToIso(values.endedAt ?? '', access.farm.timeZone) ?? values.endedAt,
			applicator: text('applicator'),
			applicatorCertNumber: text('applicatorCertNumber'),
			equipment: text('equipment'),
			weather: { tempF: num('tempF'), windMph: num('windMph'), windFrom: text('windFrom') },
			notes: text('notes')
		});
		if (!parsed.success) return fail(400, { message: 'Some values are not valid; see the messages beside them.', fields: zodFields(parsed.error), values });
		try {
			await updateRecord(access, fieldId, season, recordId, parsed.data);
		} catch (e) {
			return refused(e, values);
		}
		redirect(303, `/farms/${access.farm.id}/fields/${fieldId}/seasons/${season}/records/${recordId}?saved=1`);
	},
	delete: async (event) => {
		const { access, season, fieldId, recordId } = await target(event, 'logRecords');
		const version = Number((await event.request.formData()).get('version'));
		try {
			await deleteRecord(access, fieldId, season, recordId, Number.isInteger(version) && version > 0 ? version : undefined);
		} catch (e) {
			return refused(e);
		}
		redirect(303, `/farms/${access.farm.id}/fields/${fieldId}/seasons/${season}/records/${recordId}`);
	},
	restore: async (event) => {
		const { access, season, fieldId, recordId } = await target(event, 'editPlans');
		try {
			await restoreRecord(access, fieldId, season, recordId);
		} catch (e) {
			return refused(e);
		}
		redirect(303, `/farms/${access.farm.id}/fields/${fieldId}/seasons/${season}/records/${recordId}`);
	}
};
