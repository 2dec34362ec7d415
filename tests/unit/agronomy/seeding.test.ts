import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
	SEED_UNIT_PRESETS,
	rowFeetPerAcre,
	seedSpacingIn,
	seedUnitEstimate,
	seedUnits,
	seedsPerAcre,
	seedsPerFootOfRow,
	twinRowSeedSpacingIn
} from '../../../src/lib/agronomy/index.js';
import { expectAgronomyError, frozenCopy } from './expect-error.js';

describe('seedsPerAcre', () => {
	it('matches the published worked value', () => {
		// Iowa State Univ. Agronomy 212 (Gibson, rev. 2003): 5 seeds/ft at 15 in → 174,240 seeds/ac
		expect(seedsPerAcre(15, 12 / 5)).toBeCloseTo(174_240, 3);
	});

	it('is the inverse of seedSpacingIn', () => {
		fc.assert(
			fc.property(
				fc.double({ min: 5, max: 120, noNaN: true }),
				fc.double({ min: 0.5, max: 24, noNaN: true }),
				(width, spacing) => Math.abs(seedSpacingIn(width, seedsPerAcre(width, spacing)) - spacing) < 1e-9 * spacing
			)
		);
	});

	it('rejects bad input', () => {
		expectAgronomyError(() => seedsPerAcre(-30, 6), 'not_positive', 'row width must be more than 0 in; got -30');
		expectAgronomyError(() => seedsPerAcre(0, 6), 'not_positive', 'row width must be more than 0 in; got 0');
		expectAgronomyError(() => seedsPerAcre(30, 0), 'not_positive', 'seed spacing must be more than 0 in; got 0');
		expectAgronomyError(() => seedsPerAcre(NaN, 6), 'not_finite', 'row width must be a finite number; got NaN');
		expectAgronomyError(
			() => seedsPerAcre(30, Infinity),
			'not_finite',
			'seed spacing must be a finite number; got Infinity'
		);
	});
});

describe('seedSpacingIn', () => {
	it('matches the worked values', () => {
		// Computed: from the Iowa State Agronomy 212 formula: 30-in rows at 34,000 seeds/ac → 6.15 in
		expect(seedSpacingIn(30, 34_000)).toBeCloseTo(6.15, 2);
		// Purdue (R. Nielsen, as reported in trade press): 36,000 plants/ac at 30-in rows → 5.8 in
		expect(seedSpacingIn(30, 36_000)).toBeCloseTo(5.8, 1);
	});

	it('rejects bad input', () => {
		expectAgronomyError(() => seedSpacingIn(-30, 34_000), 'not_positive', 'row width must be more than 0 in; got -30');
		expectAgronomyError(() => seedSpacingIn(30, -1), 'not_positive', 'seeds per acre must be more than 0; got -1');
		expectAgronomyError(() => seedSpacingIn(30, NaN), 'not_finite', 'seeds per acre must be a finite number; got NaN');
	});
});

describe('seedsPerFootOfRow', () => {
	it('matches the published worked value', () => {
		// Iowa State Univ. Agronomy 212 (Gibson, rev. 2003): soybean, 15-in rows, 200,000 seeds/ac → 5.74 seeds/ft
		expect(seedsPerFootOfRow(15, 200_000)).toBeCloseTo(5.74, 2);
		// Iowa State Univ. Agronomy 212: the inverse of the 5 seeds/ft at 15 in → 174,240 seeds/ac example
		expect(seedsPerFootOfRow(15, 174_240)).toBeCloseTo(5, 10);
	});

	it('rejects bad input', () => {
		expectAgronomyError(() => seedsPerFootOfRow(0, 200_000), 'not_positive', 'row width must be more than 0 in; got 0');
		expectAgronomyError(() => seedsPerFootOfRow(15, 0), 'not_positive', 'seeds per acre must be more than 0; got 0');
	});
});

describe('rowFeetPerAcre', () => {
	it('matches the worked value', () => {
		// Computed: from the Iowa State Agronomy 212 formula: 17,424 ft of row per acre at 30 in
		expect(rowFeetPerAcre(30)).toBeCloseTo(17_424, 6);
		// Computed: same formula: 34,848 ft at 15 in
		expect(rowFeetPerAcre(15)).toBeCloseTo(34_848, 6);
	});

	it('rejects bad input', () => {
		expectAgronomyError(() => rowFeetPerAcre(-30), 'not_positive', 'row width must be more than 0 in; got -30');
		expectAgronomyError(() => rowFeetPerAcre(Infinity), 'not_finite', 'row width must be a finite number; got Infinity');
	});
});

describe('twinRowSeedSpacingIn', () => {
	it('matches the published worked value', () => {
		// Purdue (R. Nielsen, as reported in trade press): 36,000 plants/ac, twin rows on 30-in centres → 11.6 in per row
		expect(twinRowSeedSpacingIn(30, 36_000)).toBeCloseTo(11.6, 1);
	});

	it('is twice the single-row spacing at the same population', () => {
		expect(twinRowSeedSpacingIn(30, 34_000)).toBeCloseTo(2 * seedSpacingIn(30, 34_000), 12);
		expect(twinRowSeedSpacingIn(36, 32_000)).toBeCloseTo(2 * seedSpacingIn(36, 32_000), 12);
	});

	it('rejects bad input', () => {
		expectAgronomyError(
			() => twinRowSeedSpacingIn(0, 36_000),
			'not_positive',
			'twin-row pair spacing must be more than 0 in; got 0'
		);
		expectAgronomyError(() => twinRowSeedSpacingIn(30, -36_000), 'not_positive', 'seeds per acre must be more than 0; got -36000');
	});
});

describe('seedUnits', () => {
	it('matches the worked value', () => {
		// Computed: acres × seeds/ac ÷ seeds per unit: 80 ac × 34,000 ÷ 80,000 = 34.0 units
		expect(seedUnits(80, 34_000, 80_000)).toBeCloseTo(34, 12);
		// Computed: 81 ac at 34,000 on 80,000-kernel units → 34.425 units, not rounded
		expect(seedUnits(81, 34_000, 80_000)).toBeCloseTo(34.425, 12);
	});

	it('rejects bad input', () => {
		expectAgronomyError(() => seedUnits(0, 34_000, 80_000), 'not_positive', 'acres must be more than 0 ac; got 0');
		expectAgronomyError(() => seedUnits(80, -1, 80_000), 'not_positive', 'seeds per acre must be more than 0; got -1');
		expectAgronomyError(() => seedUnits(80, 34_000, 0), 'not_positive', 'seeds per unit must be more than 0; got 0');
	});
});

describe('SEED_UNIT_PRESETS', () => {
	it('holds the usual unit sizes, marked common practice', () => {
		// common practice, no published source: corn 80,000 kernels per unit
		expect(SEED_UNIT_PRESETS.corn.seedsPerUnit).toBe(80_000);
		// common practice, no published source: soybean 140,000 seeds per unit
		expect(SEED_UNIT_PRESETS.soybean.seedsPerUnit).toBe(140_000);
		expect(SEED_UNIT_PRESETS.corn.basis).toBe('common practice');
		expect(SEED_UNIT_PRESETS.soybean.basis).toBe('common practice');
	});

	it('cannot be changed by a caller', () => {
		expect(Object.isFrozen(SEED_UNIT_PRESETS)).toBe(true);
		expect(Object.isFrozen(SEED_UNIT_PRESETS.corn)).toBe(true);
	});
});

describe('seedUnitEstimate', () => {
	it('gives exact and whole units from the crop preset', () => {
		// Computed: 80 ac × 34,000 ÷ 80,000 = 34.0 units exactly: no extra unit from rounding up
		expect(seedUnitEstimate({ acres: 80, seedsPerAcre: 34_000, crop: 'corn' })).toEqual({
			seeds: 2_720_000,
			seedsPerUnit: 80_000,
			exactUnits: 34,
			wholeUnits: 34
		});
		// Computed: 81 ac → 34.425 units → 35 whole units
		const corn = seedUnitEstimate({ acres: 81, seedsPerAcre: 34_000, crop: 'corn' });
		expect(corn.exactUnits).toBeCloseTo(34.425, 12);
		expect(corn.wholeUnits).toBe(35);
		// Computed: with the common-practice soybean preset: 50 ac × 150,000 ÷ 140,000 = 53.57 → 54
		const soy = seedUnitEstimate({ acres: 50, seedsPerAcre: 150_000, crop: 'soybean' });
		expect(soy.seedsPerUnit).toBe(140_000);
		expect(soy.exactUnits).toBeCloseTo(53.5714, 4);
		expect(soy.wholeUnits).toBe(54);
	});

	it('lets seeds per unit override the preset', () => {
		// Computed: 50 ac × 150,000 ÷ 130,000 = 57.69 → 58
		const soy = seedUnitEstimate({ acres: 50, seedsPerAcre: 150_000, crop: 'soybean', seedsPerUnit: 130_000 });
		expect(soy.seedsPerUnit).toBe(130_000);
		expect(soy.exactUnits).toBeCloseTo(57.6923, 4);
		expect(soy.wholeUnits).toBe(58);
		// no crop needed when the unit size is given
		expect(seedUnitEstimate({ acres: 10, seedsPerAcre: 30_000, seedsPerUnit: 60_000 }).wholeUnits).toBe(5);
	});

	it('does not round floating-point dust up to an extra unit', () => {
		// Computed: 8.8 ac × 100,000 ÷ 80,000 = 11 units; in binary floating point it comes out as 11.000000000000002
		expect((8.8 * 100_000) / 80_000).toBeGreaterThan(11);
		const estimate = seedUnitEstimate({ acres: 8.8, seedsPerAcre: 100_000, crop: 'corn' });
		expect(estimate.exactUnits).toBeCloseTo(11, 12);
		expect(estimate.wholeUnits).toBe(11);
		// Computed: 4.9 ac × 200,000 ÷ 140,000 = 7 units (7.000000000000001 in floating point)
		expect(seedUnitEstimate({ acres: 4.9, seedsPerAcre: 200_000, crop: 'soybean' }).wholeUnits).toBe(7);
	});

	it('rejects bad input', () => {
		expectAgronomyError(
			() => seedUnitEstimate({ acres: 10, seedsPerAcre: 30_000, crop: 'wheat' as 'corn' }),
			'unknown_crop',
			'crop must be one of corn, soybean; got "wheat"'
		);
		expectAgronomyError(
			() => seedUnitEstimate({ acres: 10, seedsPerAcre: 30_000 }),
			'unknown_crop',
			'crop must be one of corn, soybean; got nothing'
		);
		expectAgronomyError(
			() => seedUnitEstimate({ acres: 10, seedsPerAcre: 30_000, crop: 'corn', seedsPerUnit: -5 }),
			'not_positive',
			'seeds per unit must be more than 0; got -5'
		);
		expectAgronomyError(
			() => seedUnitEstimate({ acres: -10, seedsPerAcre: 30_000, crop: 'corn' }),
			'not_positive',
			'acres must be more than 0 ac; got -10'
		);
	});

	it('does not change its input', () => {
		const input = frozenCopy({ acres: 81, seedsPerAcre: 34_000, crop: 'corn' as const });
		const before = structuredClone(input);
		seedUnitEstimate(input);
		expect(input).toEqual(before);
	});
});
