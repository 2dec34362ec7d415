import { requireNonNegative, requireOneOf, requirePositive } from './validate.js';

/** Square inches in one acre: 43,560 sq ft × 144. */
const SQUARE_INCHES_PER_ACRE = 6_272_640;
const SQUARE_FEET_PER_ACRE = 43_560;

/**
 * Seeds per acre from row width and in-row seed spacing: 6,272,640 ÷ (W × S).
 *
 * Source: Iowa State Univ. Agronomy 212, "Calculate seeds per foot of row and seeds per acre"
 * (L. R. Gibson, rev. 2003).
 *
 * @param rowWidthIn row width, inches (> 0)
 * @param seedSpacingIn distance between seeds within the row, inches (> 0)
 * @returns seeds per acre, unrounded
 * @example seedsPerAcre(15, 2.4) // 174,240
 */
export function seedsPerAcre(rowWidthIn: number, seedSpacingIn: number): number {
	const width = requirePositive('row width', rowWidthIn, 'in');
	const spacing = requirePositive('seed spacing', seedSpacingIn, 'in');
	return SQUARE_INCHES_PER_ACRE / (width * spacing);
}

/**
 * In-row seed spacing that gives a population at a row width: 6,272,640 ÷ (W × seeds/ac).
 *
 * Source: Iowa State Univ. Agronomy 212 (Gibson, rev. 2003), the seeds-per-acre formula solved for S.
 *
 * @param rowWidthIn row width, inches (> 0)
 * @param seedsPerAcre population, seeds per acre (> 0)
 * @returns inches between seeds in the row, unrounded
 * @example seedSpacingIn(30, 34_000) // ≈ 6.15
 */
export function seedSpacingIn(rowWidthIn: number, seedsPerAcre: number): number {
	const width = requirePositive('row width', rowWidthIn, 'in');
	const population = requirePositive('seeds per acre', seedsPerAcre);
	return SQUARE_INCHES_PER_ACRE / (width * population);
}

/**
 * Seeds per foot of row: seeds/ac ÷ 43,560 × W/12.
 *
 * Source: Iowa State Univ. Agronomy 212 (Gibson, rev. 2003).
 *
 * @example seedsPerFootOfRow(15, 200_000) // ≈ 5.74
 */
export function seedsPerFootOfRow(rowWidthIn: number, seedsPerAcre: number): number {
	const width = requirePositive('row width', rowWidthIn, 'in');
	const population = requirePositive('seeds per acre', seedsPerAcre);
	return (population / SQUARE_FEET_PER_ACRE) * (width / 12);
}

/**
 * Feet of row in one acre: 43,560 × 12 ÷ W.
 *
 * Source: Iowa State Univ. Agronomy 212 (Gibson, rev. 2003).
 *
 * @example rowFeetPerAcre(30) // 17,424
 */
export function rowFeetPerAcre(rowWidthIn: number): number {
	const width = requirePositive('row width', rowWidthIn, 'in');
	return (SQUARE_FEET_PER_ACRE * 12) / width;
}

/**
 * In-row seed spacing in each row of a twin-row pair, where pairs sit on `pairCentresIn` centres.
 * A pair holds two rows in the width one single row would occupy, so each row carries half the
 * seeds and its spacing is twice the single-row spacing at the same population. The gap between
 * the two rows of a pair does not enter the arithmetic.
 *
 * Source: Iowa State Univ. Agronomy 212 (Gibson, rev. 2003) formula; checked against the Purdue
 * value (R. Nielsen, as reported in trade press): 36,000 plants/ac → 5.8 in on 30-in rows,
 * 11.6 in per row for twin rows on 30-in centres.
 *
 * @param pairCentresIn distance between the centres of neighbouring pairs, inches (> 0)
 * @param seedsPerAcre population, seeds per acre (> 0)
 * @example twinRowSeedSpacingIn(30, 36_000) // ≈ 11.6
 */
export function twinRowSeedSpacingIn(pairCentresIn: number, seedsPerAcre: number): number {
	const centres = requirePositive('twin-row pair spacing', pairCentresIn, 'in');
	const population = requirePositive('seeds per acre', seedsPerAcre);
	return (2 * SQUARE_INCHES_PER_ACRE) / (centres * population);
}

/**
 * Seed units (bags) needed: acres × seeds/ac ÷ seeds per unit. Exact figure, not rounded up;
 * see {@link seedUnitEstimate} for whole units.
 *
 * Source: arithmetic (80 ac × 34,000 ÷ 80,000 = 34.0 units).
 */
export function seedUnits(acres: number, seedsPerAcre: number, seedsPerUnit: number): number {
	const area = requirePositive('acres', acres, 'ac');
	const population = requirePositive('seeds per acre', seedsPerAcre);
	const perUnit = requirePositive('seeds per unit', seedsPerUnit);
	return (area * population) / perUnit;
}

export type SeedUnitCrop = 'corn' | 'soybean';

export interface SeedUnitPreset {
	readonly seedsPerUnit: number;
	readonly basis: 'common practice';
	readonly note: string;
}

/**
 * Usual seeds per unit. Common practice, no published source: sellers differ, so callers must let
 * the user override the figure.
 */
export const SEED_UNIT_PRESETS: Readonly<Record<SeedUnitCrop, SeedUnitPreset>> = Object.freeze({
	corn: Object.freeze({
		seedsPerUnit: 80_000,
		basis: 'common practice',
		note: 'A corn unit is usually 80,000 kernels.'
	}),
	soybean: Object.freeze({
		seedsPerUnit: 140_000,
		basis: 'common practice',
		note: 'Soybean units are often 140,000 seeds; some are sold at 130,000 to 160,000.'
	})
});

const SEED_UNIT_CROPS = Object.keys(SEED_UNIT_PRESETS) as SeedUnitCrop[];

export interface SeedUnitEstimate {
	/** Total seeds for the area. */
	seeds: number;
	/** Seeds per unit used (the override, or the crop's preset). */
	seedsPerUnit: number;
	/** Exact units, unrounded. */
	exactUnits: number;
	/** Units rounded up to whole units. */
	wholeUnits: number;
}

/**
 * The one rule for rounding a seed amount up to whole units (or bags): round to 1/10,000 of a
 * unit first, then up. Lane acres are ellipsoidal and carry noise far below a ten-thousandth of a
 * unit (8 corn kernels), which must not buy another bag: 34.00004 units are 34, 34.0002 are 35.
 * Every place that shows whole units (plan page, seeding sheet, equipment amounts) goes through here.
 *
 * @param exactUnits units (or bags) needed, unrounded, zero or more
 * @returns whole units to buy
 * @example wholeUnitsToBuy(34.00004) // 34
 */
export function wholeUnitsToBuy(exactUnits: number): number {
	const units = requireNonNegative('units needed', exactUnits);
	return Math.ceil(Number(units.toFixed(4)));
}

/**
 * Seed units for an area, exact and rounded up to whole units. Give `seedsPerUnit` to override
 * the crop's preset; give at least one of `crop` and `seedsPerUnit`.
 *
 * Source: arithmetic; presets are common practice (see {@link SEED_UNIT_PRESETS}).
 *
 * @example seedUnitEstimate({ acres: 80, seedsPerAcre: 34_000, crop: 'corn' }) // exactUnits 34, wholeUnits 34
 */
export function seedUnitEstimate(p: {
	acres: number;
	seedsPerAcre: number;
	crop?: SeedUnitCrop;
	seedsPerUnit?: number;
}): SeedUnitEstimate {
	let perUnit: number;
	if (p.seedsPerUnit !== undefined) {
		perUnit = requirePositive('seeds per unit', p.seedsPerUnit);
	} else {
		perUnit = SEED_UNIT_PRESETS[requireOneOf('crop', p.crop, SEED_UNIT_CROPS, 'unknown_crop')].seedsPerUnit;
	}
	const exactUnits = seedUnits(p.acres, p.seedsPerAcre, perUnit);
	const wholeUnits = wholeUnitsToBuy(exactUnits);
	return { seeds: p.acres * p.seedsPerAcre, seedsPerUnit: perUnit, exactUnits, wholeUnits };
}
