import { z } from 'zod';

export const PRODUCT_KINDS = ['herbicide', 'insecticide', 'fungicide', 'fertilizer', 'seed-treatment', 'other'] as const;
export type ProductKind = (typeof PRODUCT_KINDS)[number];

/** Units a product is bought and applied in; a rate is "<unit>/ac". */
export const PRODUCT_UNITS = ['fl oz', 'pt', 'qt', 'gal', 'oz', 'lb', 'ton', 'bu', 'seeds', 'units'] as const;
export type ProductUnit = (typeof PRODUCT_UNITS)[number];

const UNIT_ALIASES: Record<string, ProductUnit> = { floz: 'fl oz', 'fl. oz': 'fl oz', 'fl.oz': 'fl oz', lbs: 'lb', gallon: 'gal', gallons: 'gal', pint: 'pt', pints: 'pt', quart: 'qt', quarts: 'qt', tons: 'ton', unit: 'units' };

/** "Gal", "lbs" and "floz" are read as gal, lb and fl oz. */
export function normalizeUnit(raw: string): string {
	const u = raw.trim().toLowerCase().replace(/\s+/g, ' ');
	return UNIT_ALIASES[u] ?? u;
}

/**
 * EPA registration number: company number, product number and, for a distributor's relabel, the
 * distributor's company number ("1234-56" or "1234-56-7890"; common practice, as printed on labels).
 */
export const EPA_REG_NO = /^[1-9]\d{0,5}-[1-9]\d{0,5}(-[1-9]\d{0,5})?$/;

const text = (max: number) => z.string().trim().max(max, `Use at most ${max} characters.`).nullish().transform((v) => v || null);

const unit = z
	.string({ message: `Give the unit the product is measured in: ${PRODUCT_UNITS.join(', ')}.` })
	.transform(normalizeUnit)
	.refine((u): u is ProductUnit => (PRODUCT_UNITS as readonly string[]).includes(u), `The unit must be one of ${PRODUCT_UNITS.join(', ')}.`);

const epaRegNo = z
	.string()
	.trim()
	.max(30)
	.nullish()
	.transform((v) => v || null)
	.refine((v) => v === null || EPA_REG_NO.test(v), 'An EPA registration number looks like 1234-56 or 1234-56-7890 (company, product, distributor).');

/** Active ingredients as one line, or a list (kept as "a; b"). */
const activeIngredients = z
	.union([z.string().trim().max(500, 'Use at most 500 characters.'), z.array(z.string().trim().min(1).max(120)).max(12, 'At most 12 active ingredients.')])
	.nullish()
	.transform((v) => (Array.isArray(v) ? v.join('; ') : v) || null);

const hours = z.number({ message: 'Hours must be a number.' }).finite().min(0, 'An interval cannot be negative.').max(8760, 'Over 8,760 h (a year) looks like a typo.').nullish().transform((v) => v ?? null);
const days = z.number({ message: 'Days must be a whole number.' }).int('Days must be a whole number.').min(0, 'An interval cannot be negative.').max(730, 'Over 730 days looks like a typo.').nullish().transform((v) => v ?? null);

const productFields = {
	name: z.string({ message: 'Name the product.' }).trim().min(1, 'Name the product.').max(80, 'Use at most 80 characters.'),
	kind: z.enum(PRODUCT_KINDS, { message: `Kind must be one of ${PRODUCT_KINDS.join(', ')}.` }),
	unit,
	epaRegNo,
	restrictedUse: z.boolean({ message: 'Restricted use is true or false.' }).nullish().transform((v) => v ?? false),
	reiHours: hours,
	phiDays: days,
	grazingDays: days,
	activeIngredients,
	formulation: text(80),
	analysis: z
		.string()
		.trim()
		.max(40)
		.nullish()
		.transform((v) => v || null)
		.refine((v) => v === null || /^\d+(\.\d+)?-\d+(\.\d+)?-\d+(\.\d+)?(-\d+(\.\d+)?S)?$/i.test(v), 'Write the grade as N-P-K, e.g. 32-0-0 or 10-34-0.'),
	poundsPerGallon: z.number({ message: 'Pounds per gallon must be a number.' }).gt(0, 'Pounds per gallon must be more than 0.').max(25, 'Over 25 lb/gal is heavier than any farm liquid.').nullish().transform((v) => v ?? null),
	notes: text(2000)
};

export const productCreateSchema = z.object(productFields);

/** An edit sends the version it started from and only the values it changes. */
export const productPatchSchema = z
	.object(productFields)
	.partial()
	.extend({ version: z.number({ message: 'Send the version you edited.' }).int().min(1) });

export type ProductInput = z.infer<typeof productCreateSchema>;
export type ProductPatch = z.infer<typeof productPatchSchema>;

/** Pesticides carry the label cautions beside them. */
export function isPesticide(kind: string): boolean {
	return kind === 'herbicide' || kind === 'insecticide' || kind === 'fungicide' || kind === 'seed-treatment';
}
