// One rule for whole seed units: the agronomy estimate, the equipment amounts (plan page seed
// table) and the seeding sheet's text all give the same whole units for the same exact figure.
import { describe, expect, it } from 'vitest';
import { AgronomyError, seedUnitEstimate, wholeUnitsToBuy } from '../../src/lib/agronomy/index';
import { seedQuantities } from '../../src/lib/equipment/index';
import { toSheetSeedQuantities } from '../../src/lib/sheet/passes';

const lane = (index: number, acres: number) => ({ index, kind: 'crop' as const, crop: 'corn', widthFt: 20, rows: 8, offsetFt: index * 20, acres, rowSpacingIn: 30 });
const assign = (laneIndex: number) => ({ laneIndex, variety: 'hybrid A', populationPerAcre: 34_000, relativeMaturity: null, seedLot: null, trialLabel: null, notes: null });

/** Whole units for an exact figure, through each of the three places that print them. */
function wholeUnitsEverywhere(exactUnits: number) {
	// acres × 34,000 ÷ 80,000 = exactUnits, split over two lanes as a plan would be.
	const acres = (exactUnits * 80_000) / 34_000;
	const { varieties } = seedQuantities([lane(0, acres / 2), lane(1, acres / 2)], [assign(0), assign(1)]);
	const sheetDetail = toSheetSeedQuantities(varieties)[0].detail ?? '';
	return {
		agronomy: seedUnitEstimate({ acres: exactUnits, seedsPerAcre: 80_000, crop: 'corn' }).wholeUnits,
		equipment: varieties[0].unitsWhole,
		equipmentExact: varieties[0].unitsExact,
		sheet: Number(sheetDetail.match(/; (\d+) whole units\.$/)?.[1])
	};
}

describe('whole seed units', () => {
	it('34.00004 units are 34 whole units in every place', () => {
		// Arithmetic: a shortfall of 0.00004 unit is 3.2 kernels of an 80,000-kernel unit
		// (80,000 a unit is common practice), far below one kernel's worth of acreage noise.
		const got = wholeUnitsEverywhere(34.00004);
		expect(got.equipmentExact).toBeCloseTo(34.00004, 9);
		expect([got.agronomy, got.equipment, got.sheet]).toEqual([34, 34, 34]);
	});

	it('34.0002 units need a 35th unit in every place', () => {
		const got = wholeUnitsEverywhere(34.0002);
		expect([got.agronomy, got.equipment, got.sheet]).toEqual([35, 35, 35]);
	});

	it('an exact 34 stays 34, and floating-point dust does not buy a unit', () => {
		expect(wholeUnitsEverywhere(34)).toMatchObject({ agronomy: 34, equipment: 34, sheet: 34 });
		// Arithmetic: 8.8 × 100,000 ÷ 80,000 = 11, which binary floating point gives as 11.000000000000002.
		expect(wholeUnitsToBuy((8.8 * 100_000) / 80_000)).toBe(11);
		expect(wholeUnitsToBuy(0)).toBe(0);
	});

	it('refuses a negative or non-numeric amount with a clear message', () => {
		expect(() => wholeUnitsToBuy(-1)).toThrow(AgronomyError);
		expect(() => wholeUnitsToBuy(-1)).toThrow('units needed must be 0 or more; got -1');
		expect(() => wholeUnitsToBuy(Number.NaN)).toThrow('units needed must be a finite number; got NaN');
	});
});
