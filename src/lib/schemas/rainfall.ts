import { z } from 'zod';
import { DAILY_MAX_IN, isCalendarDate } from '../rainfall/totals';

const text = (max: number) => z.string().trim().max(max, `Use at most ${max} characters.`).nullish().transform((v) => v || null);
const point = z.object(
	{
		lng: z.number({ message: 'Longitude must be a number.' }).min(-180, 'Longitude is within ±180.').max(180, 'Longitude is within ±180.'),
		lat: z.number({ message: 'Latitude must be a number.' }).min(-90, 'Latitude is within ±90.').max(90, 'Latitude is within ±90.')
	},
	{ message: 'A location is {lng, lat}.' }
);
const uuid = (what: string) => z.uuid({ message: `${what} must be an id from this farm.` });

export const gaugeSchema = z.object({
	name: z.string({ message: 'Name the gauge.' }).trim().min(1, 'Name the gauge.').max(60, 'Use at most 60 characters.'),
	location: point,
	fieldId: uuid('fieldId').nullish().transform((v) => v ?? null),
	notes: text(500)
});

export const gaugePatchSchema = z.object({
	version: z.number({ message: 'Send the version you edited.' }).int().min(1),
	name: gaugeSchema.shape.name.optional(),
	location: point.optional(),
	fieldId: uuid('fieldId').nullish(),
	notes: text(500).optional()
});

const inches = z
	.number({ message: 'Rain must be a number of inches.' })
	.min(0, 'Rain cannot be negative.')
	.max(DAILY_MAX_IN, `More than ${DAILY_MAX_IN} in in one day is beyond any gauge record; check the reading.`)
	.refine((v) => Math.abs(Math.round(v * 100) - v * 100) < 1e-6, 'Give rain to the hundredth of an inch (e.g. 0.35).');

export const readingSchema = z
	.object({
		gaugeId: uuid('gaugeId'),
		date: z.string().refine(isCalendarDate, 'The day as YYYY-MM-DD (a real date).').optional(),
		readAt: z.iso.datetime({ offset: true, message: 'readAt is a date and time in ISO 8601 with an offset.' }).optional(),
		inches,
		notes: text(500)
	})
	.refine((v) => v.date !== undefined || v.readAt !== undefined, { message: 'Give the day of the reading (date, YYYY-MM-DD).', path: ['date'] });

export const readingPatchSchema = z.object({
	version: z.number({ message: 'Send the version you edited.' }).int().min(1),
	inches: inches.optional(),
	notes: text(500).optional()
});

export type GaugeInput = z.infer<typeof gaugeSchema>;
export type GaugePatch = z.infer<typeof gaugePatchSchema>;
export type ReadingInput = z.infer<typeof readingSchema>;
export type ReadingPatch = z.infer<typeof readingPatchSchema>;
