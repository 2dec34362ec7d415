import { fail, redirect } from '@sveltejs/kit';
import { TZDate } from '@date-fns/tz';
import { format } from 'date-fns';
import type { Actions, PageServerLoad } from './$types';
import { zodFields } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { AppError, pageError } from '$lib/server/errors';
import { getField } from '$lib/server/fields';
import { getPlan } from '$lib/server/plans';
import { photoFiles, readPhotoForm } from '$lib/server/photos';
import { createScoutingNote, deleteScoutingNote, listScoutingNotes, restoreScoutingNote } from '$lib/server/scouting';
import { parseSeason } from '$lib/server/season';
import { scoutingNoteFromForm, scoutingNoteSchema } from '$lib/schemas/scouting';

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const season = (() => {
		try {
			return parseSeason(event.params.season);
		} catch (e) {
			return pageError(e);
		}
	})();
	const field = await getField(access, event.params.fieldId).catch(pageError);
	const plan = await getPlan(access, field.id, season).catch((e) => (e instanceof AppError && e.status === 404 ? null : pageError(e)));
	const notes = await listScoutingNotes(access, field.id, season).catch(pageError);
	const deletedNotes = access.can('editPlans') ? await listScoutingNotes(access, field.id, season, { deleted: true }).catch(pageError) : [];
	return {
		field: { id: field.id, name: field.name, boundary: field.boundary },
		season,
		plan: plan && {
			guidance: plan.guidance,
			lanes: plan.lanes.map((l) => ({ index: l.index, crop: l.crop, kind: l.kind, geometry: l.geometry, widthFt: l.widthFt, rows: l.rows }))
		},
		notes,
		deletedNotes: deletedNotes.map((n) => ({ id: n.id, laneIndex: n.laneIndex, observedAt: n.observedAt, deletedAt: n.deletedAt ?? null })),
		timeZone: access.farm.timeZone,
		nowLocal: format(new TZDate(Date.now(), access.farm.timeZone), "yyyy-MM-dd'T'HH:mm"),
		userId: access.user.id
	};
};

/** A datetime-local value ("2026-06-10T09:30") read on the farm's clock, as ISO 8601 with its offset. */
function onFarmClock(timeZone: string) {
	return (local: string) => {
		const [date, time] = local.split('T');
		const [y, m, d] = date.split('-').map(Number);
		const [hh, mm] = time.split(':').map(Number);
		return new TZDate(y, m - 1, d, hh, mm, timeZone).toISOString();
	};
}

function formValues(form: FormData): Record<string, string> {
	const out: Record<string, string> = {};
	for (const [k, v] of form.entries()) if (typeof v === 'string') out[k] = v;
	return out;
}

export const actions: Actions = {
	add: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'scout');
		const season = parseSeason(event.params.season);
		let form: FormData | null = null;
		try {
			form = await readPhotoForm(event.request);
			const parsed = scoutingNoteSchema.safeParse(scoutingNoteFromForm(form, onFarmClock(access.farm.timeZone)));
			if (!parsed.success) throw new AppError(400, 'Some values are missing or not valid; see the marked fields.', 'invalid', zodFields(parsed.error));
			const photos = await Promise.all(photoFiles(form).map(async (f) => ({ name: f.name || null, bytes: new Uint8Array(await f.arrayBuffer()) })));
			const note = await createScoutingNote(access, event.params.fieldId, season, parsed.data, photos);
			redirect(303, `?added=${note.id}#note-${note.id}`);
		} catch (e) {
			if (e instanceof AppError && e.status < 500 && e.status !== 404) {
				return fail(e.status, { message: e.message, fields: e.fields ?? {}, values: form ? formValues(form) : {} });
			}
			if (e instanceof AppError) return pageError(e);
			throw e;
		}
	},
	delete: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'scout');
		const season = parseSeason(event.params.season);
		const noteId = String((await event.request.formData()).get('noteId') ?? '');
		try {
			await deleteScoutingNote(access, event.params.fieldId, season, noteId);
		} catch (e) {
			if (e instanceof AppError && e.status === 403) return fail(403, { message: e.message, fields: {}, values: {} });
			return pageError(e);
		}
		redirect(303, '?deleted=1');
	},
	restore: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'editPlans');
		const noteId = String((await event.request.formData()).get('noteId') ?? '');
		await restoreScoutingNote(access, event.params.fieldId, parseSeason(event.params.season), noteId).catch(pageError);
		redirect(303, `?restored=1#note-${noteId}`);
	}
};
