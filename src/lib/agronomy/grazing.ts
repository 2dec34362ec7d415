import { requireInRange, requireNonNegative, requireOneOf, requirePositive, requireWholePositive } from './validate.js';

export type GrazingSpecies = 'cattle' | 'sheep' | 'goat' | 'hog' | 'poultry';

const SPECIES: readonly GrazingSpecies[] = ['cattle', 'sheep', 'goat', 'hog', 'poultry'];

/** Weight of one animal unit, lb (National Drought Mitigation Center). */
export const ANIMAL_UNIT_WEIGHT_LB = 1_000;
/** Forage dry matter one animal unit eats per day, lb (National Drought Mitigation Center). */
export const ANIMAL_UNIT_DAILY_DRY_MATTER_LB = 26;
/** Dry matter per animal-unit month: 26 lb × 30 days (arithmetic). */
export const ANIMAL_UNIT_MONTH_DRY_MATTER_LB = 780;

/**
 * Animal units by weight: head × average weight ÷ 1,000 lb, the same for every species.
 * Published per-head equivalents (NRCS National Range and Pasture Handbook, from memory: mature
 * sheep 0.20, goat 0.15) can differ from the weight figure; hogs and poultry are not in forage
 * animal-unit tables, so for them this is a size measure only.
 *
 * Source: animal unit = a 1,000-lb cow with calf (National Drought Mitigation Center).
 *
 * @example animalUnits('sheep', 30, 150) // 4.5
 */
export function animalUnits(species: GrazingSpecies, head: number, averageWeightLb: number): number {
	requireOneOf('species', species, SPECIES, 'unknown_species');
	const count = requireWholePositive('head', head);
	const weight = requirePositive('average weight', averageWeightLb, 'lb');
	return (count * weight) / ANIMAL_UNIT_WEIGHT_LB;
}

const INTAKE = { min: 0, max: 100, minInclusive: false, maxInclusive: true, unit: '%', hint: 'percent of body weight' } as const;

/**
 * Forage dry matter a group eats per day: head × weight × intake % ÷ 100.
 *
 * Source: NCAT ATTRA, "Grazier's Math" (intake as % of body weight: beef 2.5–3.0, dry ewes 2.5,
 * lactating ewes 4.5, goats 4–5).
 *
 * @example dailyDryMatterLb(30, 150, 3.5) // 157.5
 */
export function dailyDryMatterLb(head: number, weightLb: number, intakePct: number): number {
	const count = requireWholePositive('head', head);
	const weight = requirePositive('average weight', weightLb, 'lb');
	const intake = requireInRange('intake', intakePct, INTAKE);
	return (count * weight * intake) / 100;
}

/**
 * Days a paddock or lane feeds a group:
 * acres × forage dry matter above residual (lb/ac) × utilization ÷ (head × weight × intake %).
 * `utilization` is a fraction (0.5 for 50 %); `intakePct` is a percent of body weight (3.5 for 3.5 %).
 *
 * Source: NCAT ATTRA, "Grazier's Math".
 *
 * @example grazingDays({ acres: 2, forageLbPerAcre: 2_400, utilization: 0.5, head: 30, weightLb: 150, intakePct: 3.5 }) // ≈ 15.2
 */
export function grazingDays(p: {
	acres: number;
	forageLbPerAcre: number;
	utilization: number;
	head: number;
	weightLb: number;
	intakePct: number;
}): number {
	const area = requirePositive('acres', p.acres, 'ac');
	const forage = requireNonNegative('forage above residual', p.forageLbPerAcre, 'lb/ac');
	const utilization = requireInRange('utilization', p.utilization, {
		min: 0,
		max: 1,
		minInclusive: false,
		maxInclusive: true,
		hint: 'a fraction: 0.5 for 50 %'
	});
	return (area * forage * utilization) / dailyDryMatterLb(p.head, p.weightLb, p.intakePct);
}

/**
 * Stocking density: animal units per acre on the area at one time.
 *
 * Source: definition as in NCAT ATTRA, "Grazier's Math" (arithmetic on its definitions).
 *
 * @example stockingDensity(4.5, 2) // 2.25
 */
export function stockingDensity(animalUnits: number, acres: number): number {
	const units = requireNonNegative('animal units', animalUnits, 'AU');
	const area = requirePositive('acres', acres, 'ac');
	return units / area;
}
