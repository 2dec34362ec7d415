import { requireInRange, requireNonNegative, requirePositive } from './validate.js';

const PERCENT_N = { min: 0, max: 100, minInclusive: false, maxInclusive: true, unit: '%' } as const;

function checkProduct(poundsPerGallon: number, percentN: number): { density: number; fraction: number } {
	const density = requirePositive('pounds per gallon', poundsPerGallon, 'lb/gal');
	const percent = requireInRange('percent N', percentN, PERCENT_N);
	return { density, fraction: percent / 100 };
}

/**
 * Pounds of nitrogen in one gallon of a liquid product: lb/gal × %N ÷ 100.
 *
 * Sources: Univ. of Nebraska, PASSEL "Nitrogen Fertilizers" (anhydrous 82 %,
 * 5.15 lb/gal → 4.22 lb N/gal); J. Camberato, Purdue Extension (2023) (UAN 28 %, 10.6 lb/gal →
 * 2.97 lb N/gal). The product label or SDS governs density.
 */
export function poundsNitrogenPerGallon(poundsPerGallon: number, percentN: number): number {
	const { density, fraction } = checkProduct(poundsPerGallon, percentN);
	return density * fraction;
}

/**
 * Pounds of nitrogen per acre from a liquid rate: gal/ac × lb/gal × %N ÷ 100.
 *
 * Source: J. Camberato, Purdue Extension (2023): 20 gal/ac of UAN 28 % at 10.6 lb/gal → 59.4 lb N/ac.
 * Arithmetic only; not a rate recommendation.
 */
export function poundsNitrogenPerAcre(gallonsPerAcre: number, poundsPerGallon: number, percentN: number): number {
	const rate = requireNonNegative('gallons per acre', gallonsPerAcre, 'gal/ac');
	const { density, fraction } = checkProduct(poundsPerGallon, percentN);
	return rate * density * fraction;
}

/**
 * Gallons per acre of a product that deliver a chosen nitrogen rate: lb N/ac ÷ (lb/gal × %N ÷ 100).
 *
 * Source: the Purdue (Camberato, 2023) relation above, solved for gallons. Arithmetic only: the
 * nitrogen rate is the user's, not ours.
 */
export function gallonsPerAcreForNitrogen(poundsNitrogenPerAcre: number, poundsPerGallon: number, percentN: number): number {
	const target = requireNonNegative('pounds of N per acre', poundsNitrogenPerAcre, 'lb N/ac');
	const { density, fraction } = checkProduct(poundsPerGallon, percentN);
	return target / (density * fraction);
}

/**
 * Gallons of product needed for an area at a rate: acres × gal/ac.
 *
 * Source: arithmetic.
 */
export function gallonsForArea(acres: number, gallonsPerAcre: number): number {
	const area = requirePositive('acres', acres, 'ac');
	const rate = requireNonNegative('gallons per acre', gallonsPerAcre, 'gal/ac');
	return area * rate;
}

/**
 * Total pounds of nitrogen applied to an area: acres × gal/ac × lb/gal × %N ÷ 100.
 *
 * Source: as {@link poundsNitrogenPerAcre}, times the area (arithmetic).
 */
export function poundsNitrogenTotal(acres: number, gallonsPerAcre: number, poundsPerGallon: number, percentN: number): number {
	const area = requirePositive('acres', acres, 'ac');
	return area * poundsNitrogenPerAcre(gallonsPerAcre, poundsPerGallon, percentN);
}

export interface NitrogenProductPreset {
	readonly id: 'anhydrous-82' | 'uan-28';
	readonly name: string;
	readonly percentN: number;
	/** Product density at the stated basis; a default the user must be able to override. */
	readonly poundsPerGallon: number;
	/** Every preset density comes from a named published source. */
	readonly basis: 'published';
	readonly source: string;
}

/** Shown wherever a preset density is used. */
export const NITROGEN_DENSITY_CAUTION =
	'Density changes with temperature and supplier. The product label or SDS governs; enter its lb/gal where it differs.';

/**
 * Default liquid nitrogen products. Densities are starting values only (see {@link NITROGEN_DENSITY_CAUTION}).
 * UAN 32 % has no preset: no published density for it has been checked, so the farm enters the
 * lb/gal from its product label or SDS, and pounds of N are left out until it does.
 */
export const NITROGEN_PRODUCTS: readonly NitrogenProductPreset[] = Object.freeze([
	Object.freeze({
		id: 'anhydrous-82',
		name: 'Anhydrous ammonia 82-0-0',
		percentN: 82,
		poundsPerGallon: 5.15,
		basis: 'published',
		source: 'Univ. of Nebraska, PASSEL "Nitrogen Fertilizers": 5.15 lb/gal at 60 °F, 4.22 lb N/gal'
	}),
	Object.freeze({
		id: 'uan-28',
		name: 'UAN 28 %',
		percentN: 28,
		poundsPerGallon: 10.6,
		basis: 'published',
		source: 'J. Camberato, Purdue Extension (2023): 10.6 lb/gal, 2.97 lb N/gal'
	})
]);
