import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireMember } from '$lib/server/access';
import { AppError, pageError } from '$lib/server/errors';
import { parseSeason } from '$lib/server/season';
import { getField } from '$lib/server/fields';
import { listMappings, listYieldImports, readYieldUpload, setImportMapping, startYieldImport } from '$lib/server/yield-import';
import { YIELD_ROLES } from '$lib/harvest/yield-columns';

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const season = parseSeason(event.params.season);
	const field = await getField(access, event.params.fieldId).catch(pageError);
	const [imports, mappings] = await Promise.all([listYieldImports(access, field.id, season), listMappings(access)]);
	return { field: { id: field.id, name: field.name }, season, imports, sources: mappings.map((m) => m.sourceName) };
};

function refusal(e: unknown) {
	if (e instanceof AppError && [400, 409, 413].includes(e.status)) return fail(e.status, { message: e.message, fields: e.fields ?? {} });
	return pageError(e);
}

export const actions: Actions = {
	upload: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'logRecords');
		const season = parseSeason(event.params.season);
		let id: string;
		try {
			id = (await startYieldImport(access, event.params.fieldId, season, await readYieldUpload(event.request))).id;
		} catch (e) {
			return refusal(e);
		}
		redirect(303, `${event.url.pathname}?started=${id}`);
	},
	mapping: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'logRecords');
		const season = parseSeason(event.params.season);
		const form = await event.request.formData();
		const mapping: Record<string, string | null> = {};
		for (const role of YIELD_ROLES) mapping[role] = String(form.get(role) ?? '') || null;
		for (const k of ['yieldBasis', 'swathUnit', 'speedUnit']) if (form.get(k)) mapping[k] = String(form.get(k));
		const id = String(form.get('id') ?? '');
		try {
			await setImportMapping(access, event.params.fieldId, season, id, mapping);
		} catch (e) {
			return refusal(e);
		}
		redirect(303, `${event.url.pathname}?started=${id}`);
	}
};
