import { requireInRange, requireNonNegative, requireOneOf, requirePositive, requireWholePositive } from './validate.js';

export type GrainCrop = 'corn' | 'soybean' | 'wheat' | 'oats';

export interface GrainStandard {
	readonly poundsPerBushel: number;
	readonly standardMoisturePct: number;
}

/** Where {@link GRAIN_STANDARDS} comes from. */
export const GRAIN_STANDARDS_SOURCE =
	'Univ. of Wisconsin-Extension, M. Rankin, "Bushels, Test Weight, Shrink, and Storage"';

/** Standard bushel weights and moistures. Source: {@link GRAIN_STANDARDS_SOURCE}. */
export const GRAIN_STANDARDS: Readonly<Record<GrainCrop, GrainStandard>> = Object.freeze({
	corn: Object.freeze({ poundsPerBushel: 56, standardMoisturePct: 15.5 }),
	soybean: Object.freeze({ poundsPerBushel: 60, standardMoisturePct: 13 }),
	wheat: Object.freeze({ poundsPerBushel: 60, standardMoisturePct: 13.5 }),
	oats: Object.freeze({ poundsPerBushel: 32, standardMoisturePct: 14 })
});

const GRAIN_CROPS = Object.keys(GRAIN_STANDARDS) as GrainCrop[];

const MOISTURE = { min: 0, max: 100, minInclusive: true, maxInclusive: false, unit: '%' } as const;

/**
 * Weight of a grain lot once brought to a standard moisture: W_wet × (100 − M_wet) ÷ (100 − M_std).
 * The dry matter is held constant, so grain wetter than standard loses weight and grain drier than
 * standard gains it. Buyers' shrink schedules usually take more than this (handling loss); this is
 * the water-only figure.
 *
 * Source: Mulvaney & Devkota, "Adjusting Crop Yield to a Standard Moisture Content",
 * UF/IFAS EDIS SS-AGR-443 (2020).
 *
 * @param wetPounds weight as weighed, lb (≥ 0)
 * @param moisturePct moisture as weighed, % wet basis (0 to under 100)
 * @param standardMoisturePct moisture to adjust to, % wet basis (0 to under 100)
 * @example standardMoistureWeight(1_000, 25, 15.5) // ≈ 887.6
 */
export function standardMoistureWeight(wetPounds: number, moisturePct: number, standardMoisturePct: number): number {
	const weight = requireNonNegative('wet weight', wetPounds, 'lb');
	const moisture = requireInRange('moisture', moisturePct, MOISTURE);
	const standard = requireInRange('standard moisture', standardMoisturePct, MOISTURE);
	return (weight * (100 - moisture)) / (100 - standard);
}

/**
 * Percent of weight lost bringing grain from `moisturePct` to `standardMoisturePct`
 * (negative when the grain is drier than standard and so gains weight).
 *
 * Source: Mulvaney & Devkota, UF/IFAS EDIS SS-AGR-443 (2020); 25 % → 15.5 % corn loses 11.24 % (arithmetic).
 */
export function moistureShrinkPercent(moisturePct: number, standardMoisturePct: number): number {
	return 100 - standardMoistureWeight(100, moisturePct, standardMoisturePct);
}

/**
 * Yield in bushels per acre at the crop's standard moisture and bushel weight. Grain drier than
 * standard is raised to standard (its weight goes up); see {@link stripYield} for the figure that
 * leaves dry grain as weighed.
 *
 * Sources: standard weights and moistures, {@link GRAIN_STANDARDS_SOURCE}; moisture adjustment,
 * Mulvaney & Devkota, UF/IFAS EDIS SS-AGR-443 (2020).
 *
 * @param crop 'corn' | 'soybean' | 'wheat' | 'oats'
 * @param wetPounds harvested weight as weighed, lb (≥ 0)
 * @param moisturePct moisture as weighed, % (0 to under 100)
 * @param acres harvested area, acres (> 0)
 */
export function yieldBushelsPerAcre(crop: GrainCrop, wetPounds: number, moisturePct: number, acres: number): number {
	const standard = GRAIN_STANDARDS[requireOneOf('crop', crop, GRAIN_CROPS, 'unknown_crop')];
	const area = requirePositive('acres', acres, 'ac');
	const pounds = standardMoistureWeight(wetPounds, moisturePct, standard.standardMoisturePct);
	return pounds / standard.poundsPerBushel / area;
}

export interface StripYield {
	/** Harvested area: length × (rows × row spacing) ÷ 43,560. */
	acres: number;
	/** Bushels per acre at standard moisture; dry grain raised to standard. */
	bushelsPerAcreAtStandard: number;
	/** Bushels per acre with wet grain shrunk to standard but dry grain left as weighed. */
	bushelsPerAcreShrinkOnly: number;
}

/**
 * Yield of a harvested strip from its length, rows and row spacing and the weighed grain.
 * Both figures are returned because they differ only for grain drier than standard:
 * `bushelsPerAcreAtStandard` raises it to standard moisture, `bushelsPerAcreShrinkOnly` does not.
 *
 * Source: extension strip-trial calibration guidance (acres = length × width ÷ 43,560;
 * corn bu/ac = lb ÷ 56 ÷ acres × (100 − M) ÷ 84.5), with {@link GRAIN_STANDARDS} and
 * Mulvaney & Devkota, UF/IFAS EDIS SS-AGR-443 (2020).
 *
 * @example stripYield({ crop: 'corn', lengthFt: 1_000, rows: 8, rowSpacingIn: 30, wetPounds: 5_000, moisturePct: 20 })
 * // { acres ≈ 0.4591, bushelsPerAcreAtStandard ≈ 184.11, bushelsPerAcreShrinkOnly ≈ 184.11 }
 */
export function stripYield(p: {
	crop: GrainCrop;
	lengthFt: number;
	rows: number;
	rowSpacingIn: number;
	wetPounds: number;
	moisturePct: number;
}): StripYield {
	const standard = GRAIN_STANDARDS[requireOneOf('crop', p.crop, GRAIN_CROPS, 'unknown_crop')];
	const length = requirePositive('strip length', p.lengthFt, 'ft');
	const rows = requireWholePositive('rows', p.rows);
	const spacing = requirePositive('row spacing', p.rowSpacingIn, 'in');
	const acres = (length * ((rows * spacing) / 12)) / 43_560;

	const atStandard = standardMoistureWeight(p.wetPounds, p.moisturePct, standard.standardMoisturePct);
	const shrinkOnly = standardMoistureWeight(
		p.wetPounds,
		Math.max(p.moisturePct, standard.standardMoisturePct),
		standard.standardMoisturePct
	);
	return {
		acres,
		bushelsPerAcreAtStandard: atStandard / standard.poundsPerBushel / acres,
		bushelsPerAcreShrinkOnly: shrinkOnly / standard.poundsPerBushel / acres
	};
}
