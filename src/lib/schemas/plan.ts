import { z } from 'zod';
import { polygonal } from './field';

const lngLat = z
	.tuple([z.number().finite(), z.number().finite()], { message: 'A point is [longitude, latitude].' })
	.refine(([lng, lat]) => Math.abs(lng) <= 180 && Math.abs(lat) <= 90, 'Longitude must be within ±180 and latitude within ±90.');

export const laneSpecSchema = z.object({
	kind: z.enum(['crop', 'pasture', 'cover', 'buffer'], { message: 'Kind must be crop, pasture, cover or buffer.' }),
	crop: z.string().trim().min(1, 'Name the crop (or "pasture", "cover mix" …).').max(40, 'Use at most 40 characters.'),
	rows: z.number().int('Rows must be a whole number.').min(1, 'At least 1 row.').max(96, 'At most 96 rows.').optional(),
	rowSpacingIn: z.number().min(1, 'Row spacing must be more than 0 in.').max(240, 'Row spacing over 240 in is not a row crop.').optional(),
	twinSpacingIn: z.number().min(1, 'Twin spacing must be more than 0 in.').max(60).optional(),
	widthFt: z.number().min(0.5, 'A lane must be at least 0.5 ft wide.').max(2000, 'A lane over 2,000 ft wide is not a strip.').optional()
});

export const assignmentSchema = z.object({
	laneIndex: z.number().int().min(0),
	variety: z.string().trim().max(80).nullish().transform((v) => v || null),
	/** A variety picked from the farm's seed catalogue; its name is what the lane keeps. */
	varietyId: z.uuid({ message: 'Pick a variety from the seed catalogue, or type its name.' }).nullish(),
	relativeMaturity: z.number().min(0).max(200).nullish().transform((v) => v ?? null),
	populationPerAcre: z.number().int('Population is whole seeds per acre.').min(1000, 'Population under 1,000 seeds/ac looks like a typo.').max(2_000_000, 'Population over 2,000,000 seeds/ac looks like a typo.').nullish().transform((v) => v ?? null),
	seedLot: z.string().trim().max(60).nullish().transform((v) => v || null),
	trialLabel: z.string().trim().max(60).nullish().transform((v) => v || null),
	notes: z.string().trim().max(500).nullish().transform((v) => v || null)
});

export const planSettingsSchema = z.object({
	guidance: z.object({ a: lngLat, b: lngLat }),
	pattern: z.array(laneSpecSchema).min(1, 'The pattern needs at least one lane.').max(64, 'At most 64 lanes in one repeat of the pattern.'),
	offsetFt: z.number().finite().min(-100_000).max(100_000).default(0),
	headlandFt: z.number().finite().min(0, 'Headland cannot be negative.').max(500, 'Headland over 500 ft leaves little field.').default(0)
});

export const planSaveSchema = planSettingsSchema.extend({
	version: z.number({ message: 'Send the version you edited (0 for a new plan).' }).int().min(0),
	variant: z.string().trim().min(1).max(40).default('main'),
	assignments: z.array(assignmentSchema).max(5000).default([]),
	notes: z.string().trim().max(2000).nullish().transform((v) => v || null),
	/** Lay the plan out again on the field's current boundary. */
	rebase: z.boolean().default(false),
	/** Lay the plan out again with today's geometry even though its settings are unchanged. */
	relayout: z.boolean().optional()
});

export const nextSeasonSchema = z.object({
	shift: z.union([z.enum(['default', 'lane', 'lane-and-half', 'half-row']), z.number().finite().min(-10_000).max(10_000)]).default('default'),
	variant: z.string().trim().min(1).max(40).optional()
});

/** The preview takes the outline and exactly the settings a saved plan takes, bounded the same way. */
export const layoutPreviewSchema = planSettingsSchema.extend({
	boundary: polygonal,
	exclusions: z.array(polygonal).max(200, 'At most 200 exclusions per field.').optional()
});

export type PlanSaveInput = z.infer<typeof planSaveSchema>;
export type NextSeasonInput = z.infer<typeof nextSeasonSchema>;
