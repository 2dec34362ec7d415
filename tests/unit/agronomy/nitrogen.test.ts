import { describe, expect, it } from 'vitest';
import {
	NITROGEN_DENSITY_CAUTION,
	NITROGEN_PRODUCTS,
	gallonsForArea,
	gallonsPerAcreForNitrogen,
	poundsNitrogenPerAcre,
	poundsNitrogenPerGallon,
	poundsNitrogenTotal
} from '../../../src/lib/agronomy/index.js';
import { expectAgronomyError } from './expect-error.js';

describe('poundsNitrogenPerGallon', () => {
	it('matches the published worked values', () => {
		// Univ. of Nebraska, PASSEL "Nitrogen Fertilizers": anhydrous 82 %, 5.15 lb/gal at 60 °F → 4.22 lb N/gal
		expect(poundsNitrogenPerGallon(5.15, 82)).toBeCloseTo(4.22, 2);
		// J. Camberato, Purdue Extension (2023): UAN 28 %, 10.6 lb/gal → 2.97 lb N/gal
		expect(poundsNitrogenPerGallon(10.6, 28)).toBeCloseTo(2.97, 2);
		// from memory, not verified: UAN 32 %, ≈ 11.06 lb/gal → 3.54 lb N/gal
		expect(poundsNitrogenPerGallon(11.06, 32)).toBeCloseTo(3.54, 2);
	});

	it('rejects bad input', () => {
		expectAgronomyError(
			() => poundsNitrogenPerGallon(-10.6, 28),
			'not_positive',
			'pounds per gallon must be more than 0 lb/gal; got -10.6'
		);
		expectAgronomyError(
			() => poundsNitrogenPerGallon(10.6, 0),
			'out_of_range',
			'percent N must be more than 0 % and at most 100 %; got 0'
		);
		expectAgronomyError(
			() => poundsNitrogenPerGallon(10.6, 120),
			'out_of_range',
			'percent N must be more than 0 % and at most 100 %; got 120'
		);
		expectAgronomyError(() => poundsNitrogenPerGallon(10.6, NaN), 'not_finite', 'percent N must be a finite number; got NaN');
	});
});

describe('poundsNitrogenPerAcre', () => {
	it('matches the worked values', () => {
		// J. Camberato, Purdue Extension (2023): 20 gal/ac of UAN 28 % at 10.6 lb/gal → 59.4 lb N/ac
		expect(poundsNitrogenPerAcre(20, 10.6, 28)).toBeCloseTo(59.4, 1);
		// Computed: lb N/ac = gal/ac × lb/gal × %N ÷ 100 (Camberato, Purdue Extension 2023) with the from-memory UAN 32 % density: 15 gal/ac at 11.06 lb/gal → 53.09 lb N/ac
		expect(poundsNitrogenPerAcre(15, 11.06, 32)).toBeCloseTo(53.09, 2);
		// Computed: no product, no nitrogen
		expect(poundsNitrogenPerAcre(0, 11.06, 32)).toBe(0);
	});

	it('rejects bad input', () => {
		expectAgronomyError(
			() => poundsNitrogenPerAcre(-5, 10.6, 28),
			'negative',
			'gallons per acre must be 0 gal/ac or more; got -5'
		);
		expectAgronomyError(
			() => poundsNitrogenPerAcre(20, 0, 28),
			'not_positive',
			'pounds per gallon must be more than 0 lb/gal; got 0'
		);
		expectAgronomyError(
			() => poundsNitrogenPerAcre(20, 10.6, -28),
			'out_of_range',
			'percent N must be more than 0 % and at most 100 %; got -28'
		);
	});
});

describe('gallonsPerAcreForNitrogen', () => {
	it('inverts poundsNitrogenPerAcre', () => {
		// Computed: Camberato (Purdue, 2023) relation solved for gallons: 59.36 lb N/ac of UAN 28 % at 10.6 lb/gal → 20 gal/ac
		expect(gallonsPerAcreForNitrogen(59.36, 10.6, 28)).toBeCloseTo(20, 10);
		// Computed: 53.088 lb N/ac of UAN 32 % at the from-memory 11.06 lb/gal → 15 gal/ac
		expect(gallonsPerAcreForNitrogen(53.088, 11.06, 32)).toBeCloseTo(15, 10);
	});

	it('rejects bad input', () => {
		expectAgronomyError(
			() => gallonsPerAcreForNitrogen(-40, 10.6, 28),
			'negative',
			'pounds of N per acre must be 0 lb N/ac or more; got -40'
		);
		expectAgronomyError(
			() => gallonsPerAcreForNitrogen(40, 10.6, 101),
			'out_of_range',
			'percent N must be more than 0 % and at most 100 %; got 101'
		);
	});
});

describe('gallonsForArea', () => {
	it('multiplies area by rate', () => {
		// Computed: 12 ac at 15 gal/ac → 180 gal
		expect(gallonsForArea(12, 15)).toBe(180);
		// Computed: 2.5 ac at 20 gal/ac → 50 gal
		expect(gallonsForArea(2.5, 20)).toBe(50);
	});

	it('rejects bad input', () => {
		expectAgronomyError(() => gallonsForArea(0, 15), 'not_positive', 'acres must be more than 0 ac; got 0');
		expectAgronomyError(() => gallonsForArea(12, -1), 'negative', 'gallons per acre must be 0 gal/ac or more; got -1');
	});
});

describe('poundsNitrogenTotal', () => {
	it('is the per-acre figure times the area', () => {
		// Computed: 12 ac × 15 gal/ac of UAN 32 % at the from-memory 11.06 lb/gal → 12 × 53.088 = 637.056 lb N
		expect(poundsNitrogenTotal(12, 15, 11.06, 32)).toBeCloseTo(637.056, 6);
		// Computed: from Camberato (Purdue, 2023): 10 ac × 20 gal/ac of UAN 28 % → 593.6 lb N
		expect(poundsNitrogenTotal(10, 20, 10.6, 28)).toBeCloseTo(593.6, 6);
	});

	it('rejects bad input', () => {
		expectAgronomyError(() => poundsNitrogenTotal(-12, 15, 11.06, 32), 'not_positive', 'acres must be more than 0 ac; got -12');
		expectAgronomyError(
			() => poundsNitrogenTotal(12, 15, Infinity, 32),
			'not_finite',
			'pounds per gallon must be a finite number; got Infinity'
		);
	});
});

describe('NITROGEN_PRODUCTS', () => {
	const byId = (id: string) => {
		const product = NITROGEN_PRODUCTS.find((p) => p.id === id);
		if (!product) throw new Error(`no preset ${id}`);
		return product;
	};

	it('holds anhydrous 82 % as published', () => {
		// Univ. of Nebraska, PASSEL "Nitrogen Fertilizers": 82 % N, 5.15 lb/gal → 4.22 lb N/gal
		const anhydrous = byId('anhydrous-82');
		expect([anhydrous.percentN, anhydrous.poundsPerGallon, anhydrous.basis]).toEqual([82, 5.15, 'published']);
		expect(anhydrous.source).toContain('Nebraska');
		expect(poundsNitrogenPerGallon(anhydrous.poundsPerGallon, anhydrous.percentN)).toBeCloseTo(4.22, 2);
	});

	it('holds UAN 28 % as published', () => {
		// J. Camberato, Purdue Extension (2023): 10.6 lb/gal → 2.97 lb N/gal
		const uan28 = byId('uan-28');
		expect([uan28.percentN, uan28.poundsPerGallon, uan28.basis]).toEqual([28, 10.6, 'published']);
		expect(uan28.source).toContain('Purdue');
		expect(poundsNitrogenPerGallon(uan28.poundsPerGallon, uan28.percentN)).toBeCloseTo(2.97, 2);
	});

	it('holds no UAN 32 % density: with no published figure checked, the farm enters it', () => {
		expect(NITROGEN_PRODUCTS.find((p) => p.percentN === 32)).toBeUndefined();
		expect(NITROGEN_PRODUCTS.every((p) => p.basis === 'published')).toBe(true);
	});

	it('lists exactly these two and cannot be changed', () => {
		expect(NITROGEN_PRODUCTS.map((p) => p.id)).toEqual(['anhydrous-82', 'uan-28']);
		expect(Object.isFrozen(NITROGEN_PRODUCTS)).toBe(true);
		expect(NITROGEN_PRODUCTS.every((p) => Object.isFrozen(p))).toBe(true);
	});

	it('comes with the caution that the label or SDS governs density', () => {
		expect(NITROGEN_DENSITY_CAUTION).toMatch(/label or SDS governs/);
	});
});
