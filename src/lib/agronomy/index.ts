/**
 * Stripwright agronomy: pure arithmetic helpers for seeding, nitrogen, grain, intercropping,
 * grazing, acreage credit and label intervals.
 *
 * These helpers do arithmetic on the numbers they are given. They recommend nothing: a seeding
 * rate, nitrogen rate, stocking rate or interval that comes out of them is the user's input worked
 * through a published formula, not advice. Product labels govern pesticide intervals and fertiliser
 * densities; the local FSA office governs acreage.
 *
 * Every function validates its input and throws {@link AgronomyError} (with a `code` and a plain
 * message naming the argument and the bad value). Results are unrounded; round for display.
 * No I/O and no DOM: safe on server and client alike.
 */
export { AgronomyError, type AgronomyErrorCode } from './errors.js';
export {
	seedsPerAcre,
	seedSpacingIn,
	seedsPerFootOfRow,
	rowFeetPerAcre,
	twinRowSeedSpacingIn,
	seedUnits,
	seedUnitEstimate,
	wholeUnitsToBuy,
	SEED_UNIT_PRESETS,
	type SeedUnitCrop,
	type SeedUnitPreset,
	type SeedUnitEstimate
} from './seeding.js';
export {
	poundsNitrogenPerAcre,
	poundsNitrogenPerGallon,
	gallonsPerAcreForNitrogen,
	gallonsForArea,
	poundsNitrogenTotal,
	NITROGEN_PRODUCTS,
	NITROGEN_DENSITY_CAUTION,
	type NitrogenProductPreset
} from './nitrogen.js';
export {
	standardMoistureWeight,
	moistureShrinkPercent,
	yieldBushelsPerAcre,
	stripYield,
	GRAIN_STANDARDS,
	GRAIN_STANDARDS_SOURCE,
	type GrainCrop,
	type GrainStandard,
	type StripYield
} from './grain.js';
export { landEquivalentRatio, landEquivalentRatioFromStrips } from './intercrop.js';
export {
	animalUnits,
	dailyDryMatterLb,
	grazingDays,
	stockingDensity,
	ANIMAL_UNIT_WEIGHT_LB,
	ANIMAL_UNIT_DAILY_DRY_MATTER_LB,
	ANIMAL_UNIT_MONTH_DRY_MATTER_LB,
	type GrazingSpecies
} from './grazing.js';
export { creditedRowFraction, MAX_CREDITED_ROW_SPACING_IN } from './acreage.js';
export { restrictionEnds, restrictionEndsInZone, longestRestriction, type RestrictionInterval } from './intervals.js';
export { rowFeetPerThousandthAcre, plantsPerAcreFromStandCount } from './stand-count.js';
