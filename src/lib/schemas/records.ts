// Request shapes of the season record book (the JSON API and the pages share them).
import { z } from 'zod';
import { IMPOSSIBLE_RATE, rateBaseUnit, RATE_UNITS } from '../records/amounts';

export const RECORD_TYPES = ['tillage', 'planting', 'fertilizer', 'spraying', 'cover-seeding', 'replant', 'mowing', 'other'] as const;
export type RecordType = (typeof RECORD_TYPES)[number];

export const RECORD_TYPE_LABELS: Record<RecordType, string> = {
	tillage: 'Tillage',
	planting: 'Planting',
	fertilizer: 'Fertilizer',
	spraying: 'Spraying',
	'cover-seeding': 'Cover seeding',
	replant: 'Replant',
	mowing: 'Mowing / clipping',
	other: 'Other'
};

const text = (max: number) => z.string().trim().max(max, `Use at most ${max} characters.`).nullish().transform((v) => v || null);
const patchText = (max: number) => z.string().trim().max(max, `Use at most ${max} characters.`).nullable().optional();
/** A number field whose type error says which field, in words (NaN arrives for "hot" typed in a number box). */
const number = (what: string) => z.number({ message: `${what} must be a number.` }).finite(`${what} must be a number.`);
const when = (what: string) => z.iso.datetime({ offset: true, message: `${what} must be a date and time in ISO 8601 with an offset, e.g. 2026-06-02T14:30:00-05:00.` });

export const productLineSchema = z.object({
	productId: z.uuid({ message: 'Pick a product from the farm\'s product list.' }),
	rate: z
		.number({ message: 'The rate must be a number.' })
		.finite('The rate must be a number.')
		.gt(0, 'A rate must be more than 0.')
		.max(IMPOSSIBLE_RATE, 'That rate cannot be real; check the number.'),
	rateUnit: z
		.string()
		.trim()
		.refine((u) => rateBaseUnit(u) !== null, `The rate unit is a unit per acre: ${RATE_UNITS.map((u) => `${u}/ac`).join(', ')}.`)
});

export const lanePartSchema = z
	.object({
		laneIndex: z.number().int().min(0),
		fromFt: number('"From" (ft)').min(0, '"From" cannot be negative.'),
		toFt: number('"To" (ft)')
	})
	.refine((p) => p.toFt > p.fromFt, { message: '"To" must be greater than "from".', path: ['toFt'] });

const coverSpecies = z.object({
	species: z.string().trim().min(1, 'Name the species.').max(60),
	rateLbPerAcre: number('The seeding rate (lb/ac)').gt(0, 'A seeding rate must be more than 0 lb/ac.').max(500, 'Over 500 lb/ac of one species cannot be real.')
});

/** Type-specific facts; each is optional, and kept as sent in the record's details. */
export const detailsSchema = z
	.object({
		variety: text(80),
		varietyId: z.uuid().nullish(),
		populationPerAcre: z.number({ message: 'Population (seeds/ac) must be a number.' }).int('Population is whole seeds per acre.').min(1000, 'Population under 1,000 seeds/ac looks like a typo.').max(2_000_000).nullish(),
		depthIn: number('Depth (in)').gt(0, 'Depth must be more than 0 in.').max(24, 'Over 24 in is not a planting or tillage depth.').nullish(),
		seedLot: text(60),
		analysis: text(40),
		placement: z.enum(['broadcast', 'banded', 'in-furrow', '2x2', 'side-dress', 'injected', 'foliar', 'other']).nullish(),
		method: z.enum(['drilled', 'broadcast', 'interseeded', 'aerial']).nullish(),
		species: z.array(coverSpecies).max(12).nullish(),
		heightIn: number('Cutting height (in)').gt(0, 'Cutting height must be more than 0 in.').max(48, 'Over 48 in is not a cutting height.').nullish(),
		reason: text(200)
	})
	.strict();

const recordFields = {
	type: z.enum(RECORD_TYPES, { message: `Type must be one of ${RECORD_TYPES.join(', ')}.` }),
	startedAt: when('Start'),
	endedAt: when('End'),
	laneIndexes: z.array(z.number().int('Lane indexes are whole numbers.').min(0, 'Lane indexes start at 0.')).min(1, 'Pick at least one lane.').max(2000),
	laneParts: z.array(lanePartSchema).max(2000).optional(),
	products: z.array(productLineSchema).max(20, 'At most 20 products on one record.').default([]),
	applicator: text(120),
	applicatorCertNumber: text(60),
	equipment: text(120),
	weather: z
		.object({
			tempF: number('Temperature (°F)').min(-60, 'Below −60 °F is not field weather.').max(140, 'Above 140 °F is not field weather.').nullish(),
			windMph: number('Wind speed (mph)').min(0, 'Wind speed cannot be negative.').max(150, 'Over 150 mph is not field weather.').nullish(),
			windFrom: text(20)
		})
		.nullish(),
	details: detailsSchema.nullish(),
	notes: text(4000)
};

export const recordCreateSchema = z.object(recordFields);
export type RecordInput = z.output<typeof recordCreateSchema>;

export const recordPatchSchema = z.object({
	version: z.number({ message: 'Send the version you edited.' }).int().min(1),
	type: recordFields.type.optional(),
	startedAt: recordFields.startedAt.optional(),
	endedAt: recordFields.endedAt.optional(),
	laneIndexes: recordFields.laneIndexes.optional(),
	laneParts: recordFields.laneParts,
	products: z.array(productLineSchema).max(20).optional(),
	// Absent means "keep"; null or "" clears.
	applicator: patchText(120),
	applicatorCertNumber: patchText(60),
	equipment: patchText(120),
	weather: recordFields.weather,
	details: recordFields.details,
	notes: patchText(4000)
});
export type RecordPatch = z.output<typeof recordPatchSchema>;
