import { z } from 'zod';

const text = (max: number) => z.string().trim().max(max, `Use at most ${max} characters.`).nullish().transform((v) => v || null);

const varietyFields = {
	crop: z.string({ message: 'Name the crop (corn, soybean, cereal rye …).' }).trim().min(1, 'Name the crop (corn, soybean, cereal rye …).').max(40, 'Use at most 40 characters.'),
	name: z.string({ message: 'Name the variety or hybrid.' }).trim().min(1, 'Name the variety or hybrid.').max(80, 'Use at most 80 characters.'),
	// Corn in days (70–130), soybean as a maturity group (000 → 0, up to 10): one number, 0–200.
	relativeMaturity: z.number({ message: 'Relative maturity must be a number.' }).min(0, 'Relative maturity cannot be negative.').max(200, 'Relative maturity over 200 days looks like a typo.').nullish().transform((v) => v ?? null),
	seedsPerUnit: z.number({ message: 'Seeds per unit must be a whole number.' }).int('Seeds per unit must be a whole number.').min(1, 'Seeds per unit must be at least 1.').max(10_000_000, 'Over 10,000,000 seeds per unit looks like a typo.').nullish().transform((v) => v ?? null),
	traits: z
		.union([z.string().trim().max(300, 'Use at most 300 characters.'), z.array(z.string().trim().min(1).max(80)).max(12, 'At most 12 traits.')])
		.nullish()
		.transform((v) => (Array.isArray(v) ? v.join('; ') : v) || null),
	notes: text(2000)
};

export const varietyCreateSchema = z.object(varietyFields);
export const varietyPatchSchema = z
	.object(varietyFields)
	.partial()
	.extend({ version: z.number({ message: 'Send the version you edited.' }).int().min(1) });

export const seedLotCreateSchema = z.object({
	lotNumber: z.string({ message: 'Give the lot number printed on the tag.' }).trim().min(1, 'Give the lot number printed on the tag.').max(60, 'Use at most 60 characters.'),
	germinationPct: z.number({ message: 'Germination is a percentage.' }).min(0, 'Germination is 0–100 %.').max(100, 'Germination is 0–100 %.').nullish().transform((v) => v ?? null),
	treatment: text(200),
	unitsOnHand: z.number({ message: 'Units on hand must be a number.' }).min(0, 'Units on hand cannot be negative.').max(1_000_000).nullish().transform((v) => v ?? null),
	notes: text(2000)
});

export type VarietyInput = z.infer<typeof varietyCreateSchema>;
export type VarietyPatch = z.infer<typeof varietyPatchSchema>;
export type SeedLotInput = z.infer<typeof seedLotCreateSchema>;
