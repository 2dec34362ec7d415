import { z } from 'zod';

const text = (max: number) => z.string().trim().max(max, `Use at most ${max} characters.`).nullish().transform((v) => v || null);

export const standCountSchema = z.object({
	plantsCounted: z.number({ message: 'Plants counted must be a number.' }).int('Plants counted is a whole number.').min(0, 'Plants counted cannot be negative.').max(10_000, 'Over 10,000 plants in one count looks like a typo.'),
	rowFeetCounted: z.number().gt(0, 'The row length counted must be more than 0 ft.').max(5_280, 'Count at most a mile of row.').optional(),
	rowSpacingIn: z.number().gt(0, 'Row spacing must be more than 0 in.').max(240, 'Row spacing over 240 in is not a row crop.').optional()
});

const noteFields = {
	observedAt: z.iso.datetime({ offset: true, message: 'When it was seen: a date and time in ISO 8601 with an offset, e.g. 2026-06-02T14:30:00-05:00.' }),
	growthStage: text(40),
	pests: text(1000),
	diseases: text(1000),
	weeds: text(1000),
	notes: text(4000),
	standCount: standCountSchema.nullish().transform((v) => v ?? null)
};

const place = {
	laneIndex: z.number().int('Lane is a whole number.').min(0, 'Lanes are counted from 0 in the API (1 on the page).').max(100_000).optional(),
	location: z
		.object({ lng: z.number().min(-180).max(180), lat: z.number().min(-90).max(90) }, { message: 'A location is {lng, lat}.' })
		.optional(),
	positionFt: z.number().min(0, 'Position along the lane cannot be negative.').max(100_000).optional()
};

/** A new scouting note: a place (a map point, a lane, or a lane and a distance along it) and what was seen. */
export const scoutingNoteSchema = z
	.object({ ...place, ...noteFields })
	.refine((v) => v.laneIndex !== undefined || v.location !== undefined, { message: 'Pick a point on the map or give a lane number.', path: ['laneIndex'] });

/** An edit: what was seen, and the version the editor started from. The place stays as recorded. */
export const scoutingNotePatchSchema = z.object({
	version: z.number({ message: 'Send the version you edited.' }).int().min(1),
	observedAt: noteFields.observedAt.optional(),
	growthStage: noteFields.growthStage.optional(),
	pests: noteFields.pests.optional(),
	diseases: noteFields.diseases.optional(),
	weeds: noteFields.weeds.optional(),
	notes: noteFields.notes.optional(),
	standCount: noteFields.standCount.optional()
});

export type ScoutingNoteInput = z.infer<typeof scoutingNoteSchema>;
export type ScoutingNotePatch = z.infer<typeof scoutingNotePatchSchema>;

const numberOrNothing = (v: FormDataEntryValue | null): number | undefined => {
	if (typeof v !== 'string' || v.trim() === '') return undefined;
	const n = Number(v.trim());
	return Number.isNaN(n) ? (v as unknown as number) : n; // a non-number reaches the schema and is refused there
};
const textOrNothing = (v: FormDataEntryValue | null) => (typeof v === 'string' ? v : undefined);

/**
 * The JSON-shaped note from form data (the page's form and multipart API posts). Lane numbers on
 * the page are 1-based (`lane`); the API's `laneIndex` is 0-based.
 */
export function scoutingNoteFromForm(form: FormData, timeZoneOffset?: (local: string) => string): Record<string, unknown> {
	const lane = numberOrNothing(form.get('lane'));
	const laneIndex = numberOrNothing(form.get('laneIndex')) ?? (typeof lane === 'number' ? lane - 1 : lane);
	const lng = numberOrNothing(form.get('lng'));
	const lat = numberOrNothing(form.get('lat'));
	const plants = numberOrNothing(form.get('plantsCounted'));
	let observedAt = textOrNothing(form.get('observedAt'));
	// A page's datetime-local input has no offset: the farm's zone decides it.
	if (observedAt && timeZoneOffset && /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2})?$/.test(observedAt)) observedAt = timeZoneOffset(observedAt);
	return {
		laneIndex,
		location: lng !== undefined || lat !== undefined ? { lng, lat } : undefined,
		positionFt: numberOrNothing(form.get('positionFt')),
		observedAt,
		growthStage: textOrNothing(form.get('growthStage')),
		pests: textOrNothing(form.get('pests')),
		diseases: textOrNothing(form.get('diseases')),
		weeds: textOrNothing(form.get('weeds')),
		notes: textOrNothing(form.get('notes')),
		standCount:
			plants === undefined
				? undefined
				: { plantsCounted: plants, rowFeetCounted: numberOrNothing(form.get('rowFeetCounted')), rowSpacingIn: numberOrNothing(form.get('rowSpacingIn')) }
	};
}
