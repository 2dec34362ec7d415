import { describe, expect, it } from 'vitest';
import {
	ANIMAL_UNIT_DAILY_DRY_MATTER_LB,
	ANIMAL_UNIT_MONTH_DRY_MATTER_LB,
	ANIMAL_UNIT_WEIGHT_LB,
	animalUnits,
	dailyDryMatterLb,
	grazingDays,
	stockingDensity
} from '../../../src/lib/agronomy/index.js';
import { expectAgronomyError, frozenCopy } from './expect-error.js';

const ewes = { acres: 2, forageLbPerAcre: 2_400, utilization: 0.5, head: 30, weightLb: 150, intakePct: 3.5 };

describe('animal unit constants', () => {
	it('match the published definition', () => {
		// National Drought Mitigation Center: one animal unit is a 1,000-lb cow with calf eating 26 lb DM a day
		expect(ANIMAL_UNIT_WEIGHT_LB).toBe(1_000);
		expect(ANIMAL_UNIT_DAILY_DRY_MATTER_LB).toBe(26);
		// Computed: AUM = 26 lb × 30 days = 780 lb DM
		expect(ANIMAL_UNIT_MONTH_DRY_MATTER_LB).toBe(ANIMAL_UNIT_DAILY_DRY_MATTER_LB * 30);
	});
});

describe('animalUnits', () => {
	it('is head × weight ÷ 1,000 lb', () => {
		// National Drought Mitigation Center: a 1,000-lb cow is one animal unit
		expect(animalUnits('cattle', 1, 1_000)).toBe(1);
		// Computed: 30 ewes × 150 lb ÷ 1,000 = 4.5 AU
		expect(animalUnits('sheep', 30, 150)).toBeCloseTo(4.5, 12);
		// Computed: 12 hogs × 250 lb ÷ 1,000 = 3 AU (a size measure only: hogs are not in forage AU tables)
		expect(animalUnits('hog', 12, 250)).toBeCloseTo(3, 12);
		// Computed: 20 goats × 100 lb → 2 AU
		expect(animalUnits('goat', 20, 100)).toBeCloseTo(2, 12);
		// Computed: 200 hens × 5 lb → 1 AU
		expect(animalUnits('poultry', 200, 5)).toBeCloseTo(1, 12);
	});

	it('rejects bad input', () => {
		expectAgronomyError(
			() => animalUnits('horse' as 'cattle', 1, 1_000),
			'unknown_species',
			'species must be one of cattle, sheep, goat, hog, poultry; got "horse"'
		);
		expectAgronomyError(() => animalUnits('sheep', 2.5, 150), 'not_integer', 'head must be a whole number; got 2.5');
		expectAgronomyError(() => animalUnits('sheep', 0, 150), 'not_positive', 'head must be more than 0; got 0');
		expectAgronomyError(() => animalUnits('sheep', 30, -150), 'not_positive', 'average weight must be more than 0 lb; got -150');
	});
});

describe('dailyDryMatterLb', () => {
	it('matches the worked value', () => {
		// Computed: NCAT ATTRA "Grazier's Math" formula: 30 ewes × 150 lb × 3.5 % = 157.5 lb DM/day
		expect(dailyDryMatterLb(30, 150, 3.5)).toBeCloseTo(157.5, 10);
		// Computed: same formula, beef at 2.5 % (ATTRA range 2.5–3.0): 10 head × 1,200 lb → 300 lb/day
		expect(dailyDryMatterLb(10, 1_200, 2.5)).toBeCloseTo(300, 10);
	});

	it('rejects bad input', () => {
		expectAgronomyError(
			() => dailyDryMatterLb(30, 150, 0),
			'out_of_range',
			'intake must be more than 0 % and at most 100 % (percent of body weight); got 0'
		);
		expectAgronomyError(
			() => dailyDryMatterLb(30, 150, 350),
			'out_of_range',
			'intake must be more than 0 % and at most 100 % (percent of body weight); got 350'
		);
		expectAgronomyError(() => dailyDryMatterLb(-30, 150, 3.5), 'not_positive', 'head must be more than 0; got -30');
	});
});

describe('grazingDays', () => {
	it('matches the worked value', () => {
		// Computed: NCAT ATTRA "Grazier's Math" formula: 2 ac × 2,400 lb × 50 % ÷ 157.5 lb/day → 15.2 days
		expect(grazingDays(ewes)).toBeCloseTo(15.24, 2);
		// Computed: double the head, half the days
		expect(grazingDays({ ...ewes, head: 60 })).toBeCloseTo(15.238 / 2, 3);
		// Computed: no forage above residual, no grazing
		expect(grazingDays({ ...ewes, forageLbPerAcre: 0 })).toBe(0);
	});

	it('rejects bad input', () => {
		expectAgronomyError(
			() => grazingDays({ ...ewes, utilization: 50 }),
			'out_of_range',
			'utilization must be more than 0 and at most 1 (a fraction: 0.5 for 50 %); got 50'
		);
		expectAgronomyError(
			() => grazingDays({ ...ewes, utilization: 0 }),
			'out_of_range',
			'utilization must be more than 0 and at most 1 (a fraction: 0.5 for 50 %); got 0'
		);
		expectAgronomyError(() => grazingDays({ ...ewes, acres: 0 }), 'not_positive', 'acres must be more than 0 ac; got 0');
		expectAgronomyError(
			() => grazingDays({ ...ewes, forageLbPerAcre: -1 }),
			'negative',
			'forage above residual must be 0 lb/ac or more; got -1'
		);
		expectAgronomyError(() => grazingDays({ ...ewes, head: 0 }), 'not_positive', 'head must be more than 0; got 0');
		expectAgronomyError(() => grazingDays({ ...ewes, weightLb: NaN }), 'not_finite', 'average weight must be a finite number; got NaN');
		expectAgronomyError(
			() => grazingDays({ ...ewes, intakePct: -3.5 }),
			'out_of_range',
			'intake must be more than 0 % and at most 100 % (percent of body weight); got -3.5'
		);
	});

	it('does not change its input', () => {
		const input = frozenCopy({ ...ewes });
		const before = structuredClone(input);
		grazingDays(input);
		expect(input).toEqual(before);
	});
});

describe('stockingDensity', () => {
	it('is animal units per acre', () => {
		// Computed: stocking density = AU per acre at one time (NCAT ATTRA, "Grazier's Math"): 4.5 AU (30 ewes × 150 lb) on 2 ac → 2.25 AU/ac
		expect(stockingDensity(animalUnits('sheep', 30, 150), 2)).toBeCloseTo(2.25, 12);
		expect(stockingDensity(0, 2)).toBe(0);
	});

	it('rejects bad input', () => {
		expectAgronomyError(() => stockingDensity(-1, 2), 'negative', 'animal units must be 0 AU or more; got -1');
		expectAgronomyError(() => stockingDensity(4.5, 0), 'not_positive', 'acres must be more than 0 ac; got 0');
	});
});
